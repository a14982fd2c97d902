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
  /** Public base URL used in links that leave the app (e-mails, QR codes); defaults to http://HOST:PORT. */
  APP_URL: z.url().optional(),
  /** Signs access tokens. No default: `npm start` generates one into .data/ on first start. */
  JWT_ACCESS_SECRET: z.string().min(32, { error: 'JWT_ACCESS_SECRET must be at least 32 characters' }),
  ACCESS_TOKEN_TTL_SECONDS: z.coerce.number().int().min(30).max(86_400).default(900),
  REFRESH_TOKEN_TTL_DAYS: z.coerce.number().int().min(1).max(365).default(30),
  INVITATION_TTL_HOURS: z.coerce.number().int().min(1).max(24 * 30).default(72),
  PASSWORD_RESET_TTL_MINUTES: z.coerce.number().int().min(5).max(24 * 60).default(60),
  /** Hosted SMTP service (smtp:// or smtps://). When absent, a local capture server runs in-process. */
  SMTP_URL: z.string().regex(/^smtps?:\/\//, 'SMTP_URL must be an smtp:// or smtps:// URL').optional(),
  /** Port of the local SMTP capture server on 127.0.0.1 (0 picks a free one). */
  LOCAL_SMTP_PORT: z.coerce.number().int().min(0).max(65_535).default(2525),
  MAIL_FROM: z.string().min(3).default('Loamline <no-reply@loamline.example>'),
  LOG_LEVEL: z.enum(['error', 'warn', 'log', 'debug', 'verbose']).default('log'),
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

/** The base URL for links that leave the app, without a trailing slash. */
export function publicAppUrl(env: Pick<Env, 'APP_URL' | 'HOST' | 'PORT'>): string {
  return (env.APP_URL ?? `http://${env.HOST === '0.0.0.0' ? '127.0.0.1' : env.HOST}:${env.PORT}`).replace(/\/+$/, '');
}
