import { readFileSync } from 'node:fs';

import { z } from 'zod';

/**
 * Every setting the API reads from its environment. This is the only file that touches `process.env`;
 * everything else receives a parsed, typed `Env` through Nest's ConfigService.
 */
export const EnvSchema = z.object({
  NODE_ENV: z.enum(['development', 'production', 'test']).default('development'),
  HOST: z.string().min(1).default('127.0.0.1'),
  PORT: z.coerce.number().int().min(0).max(65_535).default(3000),
  DATABASE_URL: z
    .string({ error: 'DATABASE_URL is required (npm start sets it for the local cluster)' })
    .regex(/^postgres(ql)?:\/\//, 'DATABASE_URL must be a postgres:// URL'),
  /** Folder of the built web app (web/dist); when absent the API serves only /api. */
  WEB_DIST_DIR: z.string().min(1).optional(),
  LOG_FORMAT: z.enum(['json', 'text']).default('json'),
  /**
   * The OpenAPI UI and JSON (`/api/docs`, `/api/docs-json`) for everyone: by default outside
   * production only; in production `1` serves them, otherwise only to signed-in staff (bearer token).
   */
  API_DOCS: z.stringbool().optional(),
  /** Public base URL used in links that leave the app (e-mails, QR codes); defaults to http://HOST:PORT. */
  APP_URL: z.url().optional(),
  /** Signs access tokens. No default: `npm start` generates one into .data/ on first start. */
  JWT_ACCESS_SECRET: z.string().min(32, { error: 'JWT_ACCESS_SECRET must be at least 32 characters' }),
  ACCESS_TOKEN_TTL_SECONDS: z.coerce.number().int().min(30).max(86_400).default(900),
  REFRESH_TOKEN_TTL_DAYS: z.coerce.number().int().min(1).max(365).default(30),
  /**
   * Seconds after a refresh token is rotated during which presenting it again returns the same
   * successor (several tabs refreshing at once) instead of counting as reuse; 0 turns it off.
   */
  REFRESH_REUSE_GRACE_SECONDS: z.coerce.number().int().min(0).max(300).default(30),
  INVITATION_TTL_HOURS: z.coerce.number().int().min(1).max(24 * 30).default(72),
  PASSWORD_RESET_TTL_MINUTES: z.coerce.number().int().min(5).max(24 * 60).default(60),
  /** Who may create a company: `open` (anyone), `invite` (a code from `npm run company:invite`), `closed`. */
  SIGNUP_MODE: z.enum(['open', 'invite', 'closed']).default('open'),
  /** How long a company sign-up's verification link works, hours (unverified sign-ups expire). */
  SIGNUP_TTL_HOURS: z.coerce.number().int().min(1).max(24 * 14).default(24),
  /** Whom to ask for an account when sign-up is closed or by invitation (shown on the sign-up page). */
  SIGNUP_CONTACT: z.string().trim().min(1).max(200).optional(),
  /**
   * Hosted SMTP service (smtp:// or smtps://). When absent, a local capture server runs in-process
   * whatever NODE_ENV is, and mail is read on the Outbox page.
   */
  SMTP_URL: z.string().regex(/^smtps?:\/\//, 'SMTP_URL must be an smtp:// or smtps:// URL').optional(),
  /** Port of the local SMTP capture server on 127.0.0.1 (0 picks a free one). */
  LOCAL_SMTP_PORT: z.coerce.number().int().min(0).max(65_535).default(2525),
  MAIL_FROM: z.string().min(3).default('Loamline <no-reply@loamline.example>'),
  LOG_LEVEL: z.enum(['error', 'warn', 'log', 'debug', 'verbose']).default('log'),
  /** Where uploads, photo derivatives and packets are stored: the local disk or an S3-compatible service. */
  STORAGE_DRIVER: z.enum(['disk', 's3']).default('disk'),
  /** Root folder of the disk driver (relative paths resolve against the working directory). */
  UPLOADS_DIR: z.string().min(1).default('.data/uploads'),
  /** S3-compatible endpoint (e.g. http://127.0.0.1:4568); absent means AWS itself. */
  S3_ENDPOINT: z.url().optional(),
  S3_BUCKET: z.string().min(3).optional(),
  S3_REGION: z.string().min(1).default('us-east-1'),
  /** Credentials of the S3 driver; without them the AWS SDK's default chain applies (no defaults here). */
  S3_ACCESS_KEY_ID: z.string().min(1).optional(),
  S3_SECRET_ACCESS_KEY: z.string().min(1).optional(),
  /** Path-style URLs (http://host/bucket/key), which s3rver and most self-hosted services need. */
  S3_FORCE_PATH_STYLE: z.stringbool().default(false),
  /** The Chromium binary the packet renderer drives (Debian's `chromium` package). */
  CHROMIUM_PATH: z.string().min(1).default('/usr/bin/chromium'),
  /** Process packet renders in the API process too; set false when separate `npm run worker` processes do it. */
  PACKET_WORKER_IN_API: z.stringbool().default(true),
  /** Packets one process prints at once (each is a Chromium page). */
  PACKET_RENDER_CONCURRENCY: z.coerce.number().int().min(1).max(16).default(2),
  /** Limit for loading and for printing one packet in Chromium, ms (each). */
  PACKET_RENDER_TIMEOUT_MS: z.coerce.number().int().min(1000).max(600_000).default(60_000),
  /**
   * A render not finished this long after it started is presumed dead (its worker was killed): pg-boss
   * expires the attempt and retries it, and another worker may claim the revision. Keep it above the
   * longest render (twice PACKET_RENDER_TIMEOUT_MS plus photos and storage), seconds.
   */
  PACKET_RENDER_STALE_SECONDS: z.coerce.number().int().min(10).max(86_400).default(900),
  /** Retries of a failed render (with exponential backoff) before the revision is marked failed. */
  PACKET_RENDER_RETRIES: z.coerce.number().int().min(0).max(10).default(3),
  /** How often an idle worker polls the queue, seconds (pg-boss 10 minimum 0.5). */
  QUEUE_POLL_INTERVAL_SECONDS: z.coerce.number().min(0.5).max(60).default(1),
  /** How often the queue looks for expired (abandoned) jobs to retry, seconds (pg-boss maintenance). */
  QUEUE_MAINTENANCE_INTERVAL_SECONDS: z.coerce.number().int().min(1).max(3600).default(120),
  /** Largest packet PDF sent as an e-mail attachment, bytes; a larger one is sent as a link only. */
  MAIL_MAX_ATTACHMENT_BYTES: z.coerce.number().int().min(0).default(10 * 1024 * 1024),
  /** Retries of a failed packet e-mail (with exponential backoff) before the delivery is marked failed. */
  PACKET_SEND_RETRIES: z.coerce.number().int().min(0).max(20).default(5),
  /** First retry delay of a failed packet e-mail, seconds (doubles each retry). */
  PACKET_SEND_RETRY_DELAY_SECONDS: z.coerce.number().int().min(1).max(3600).default(30),
  /** Retries of a failed account e-mail (invitation, password reset) before it is marked failed. */
  ACCOUNT_MAIL_RETRIES: z.coerce.number().int().min(0).max(20).default(8),
  /** First retry delay of a failed account e-mail, seconds (doubles each retry). */
  ACCOUNT_MAIL_RETRY_DELAY_SECONDS: z.coerce.number().int().min(1).max(3600).default(30),
  /** SMTP limits, ms: opening the connection, the server's greeting, and silence on an open connection. */
  SMTP_CONNECTION_TIMEOUT_MS: z.coerce.number().int().min(100).max(600_000).default(10_000),
  SMTP_GREETING_TIMEOUT_MS: z.coerce.number().int().min(100).max(600_000).default(10_000),
  SMTP_SOCKET_TIMEOUT_MS: z.coerce.number().int().min(100).max(600_000).default(30_000),
  /** Sign-in and reset requests one client address may make per minute before 429. */
  SIGN_IN_LIMIT_PER_ADDRESS_PER_MINUTE: z.coerce.number().int().min(1).max(100_000).default(30),
  /** Sign-in and reset requests naming one account from one client address per 15 minutes before 429 (password guessing). */
  SIGN_IN_LIMIT_PER_ACCOUNT: z.coerce.number().int().min(1).max(100_000).default(9),
  /** Sign-in and reset requests naming one account from all addresses together per 15 minutes before 429. */
  SIGN_IN_LIMIT_PER_ACCOUNT_GLOBAL: z.coerce.number().int().min(1).max(100_000).default(50),
  /**
   * Express `trust proxy`: set it when a reverse proxy terminates HTTPS in front of the API (e.g.
   * `loopback` or `1` for one hop), so the refresh cookie is marked Secure and client addresses are
   * the real ones. Unset: the connection itself is trusted, and X-Forwarded-* headers are ignored.
   */
  TRUST_PROXY: z.string().min(1).optional(),
  /** Public locate views (and their files) one client address may open per minute. */
  LOCATE_RATE_LIMIT_PER_MINUTE: z.coerce.number().int().min(1).max(10_000).default(60),
  /** Unknown, expired or revoked locate tokens one client address may try per minute before 429. */
  LOCATE_FAILED_LOOKUPS_PER_MINUTE: z.coerce.number().int().min(1).max(1000).default(10),
  /** Lifetime of the locate link created when a packet is issued (its QR code), days. */
  LOCATE_LONG_LIVED_DAYS: z.coerce.number().int().min(1).max(36_500).default(3652),
  /** Largest accepted upload file, in bytes (larger: 413). */
  UPLOAD_MAX_FILE_BYTES: z.coerce.number().int().min(1024).default(25 * 1024 * 1024),
  /** Most files accepted in one upload request (more: 413). */
  UPLOAD_MAX_FILES: z.coerce.number().int().min(1).max(100).default(10),
  /** Largest decoded image accepted, in pixels (decompression-bomb guard; larger: 413). */
  UPLOAD_MAX_INPUT_PIXELS: z.coerce.number().int().min(1_000_000).default(100_000_000),
  /** Longest accepted image side, in pixels (photos and site plans; longer: 413). */
  UPLOAD_MAX_IMAGE_SIDE_PX: z.coerce.number().int().min(1000).max(100_000).default(20_000),
  /** Most elongated accepted image, long side over short side (photos and site plans; more: 422). */
  UPLOAD_MAX_ASPECT_RATIO: z.coerce.number().min(2).max(1000).default(10),
  /** Images one API process decodes and resizes at once; the rest wait in a queue (keep below the core count). */
  IMAGE_PROCESSING_CONCURRENCY: z.coerce.number().int().min(1).max(16).default(1),
  /** Upload requests (photos, site plans) one user may have in flight at once; one more gets 429. */
  UPLOAD_MAX_CONCURRENT_PER_USER: z.coerce.number().int().min(1).max(100).default(2),
  /** Worker threads that lay out and draw job drawings (SVG) off the event loop. */
  DRAWING_THREADS: z.coerce.number().int().min(1).max(16).default(1),
  /**
   * When those threads start: `at-start` (with the API, so the first drawing finds one ready) or
   * `on-demand` (at the first drawing; the tests' many short-lived apps, most of which draw nothing).
   */
  DRAWING_THREADS_START: z.enum(['at-start', 'on-demand']).default('at-start'),
  /** Memory for finished drawings kept for repeated requests, MB (0 turns the cache off). */
  DRAWING_CACHE_MB: z.coerce.number().int().min(0).max(4096).default(64),
}).superRefine((env, ctx) => {
  if (env.STORAGE_DRIVER === 's3' && !env.S3_BUCKET) {
    ctx.addIssue({ code: 'custom', path: ['S3_BUCKET'], message: 'S3_BUCKET is required when STORAGE_DRIVER=s3' });
  }
});

export type Env = z.infer<typeof EnvSchema>;

/** Parses an environment (by default this process's) and fails with one line per bad variable. */
export function readEnv(source: Record<string, string | undefined> = process.env): Env {
  const parsed = EnvSchema.safeParse(source);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((issue) => `  ${issue.path.join('.')}: ${issue.message}`);
    throw new Error(`Invalid environment:\n${lines.join('\n')}`);
  }
  return parsed.data;
}

/** The API's version, from api/package.json (the same path from src/ and from dist/). */
export const APP_VERSION: string = (
  JSON.parse(readFileSync(new URL('../../package.json', import.meta.url), 'utf8')) as { version: string }
).version;

/** Where mail goes, for logs and the Outbox page: the SMTP service's scheme, host and port (never its credentials). */
export function mailDestination(smtpUrl: string | undefined): string | null {
  if (!smtpUrl) return null;
  try {
    const url = new URL(smtpUrl);
    return `${url.protocol}//${url.hostname}${url.port ? `:${url.port}` : ''}`;
  } catch {
    return 'the configured SMTP service';
  }
}

/** The base URL for links that leave the app, without a trailing slash. */
export function publicAppUrl(env: Pick<Env, 'APP_URL' | 'HOST' | 'PORT'>): string {
  return (env.APP_URL ?? `http://${env.HOST === '0.0.0.0' ? '127.0.0.1' : env.HOST}:${env.PORT}`).replace(/\/+$/, '');
}
