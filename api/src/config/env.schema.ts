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
