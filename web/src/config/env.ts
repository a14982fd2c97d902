import { z } from 'zod';

/**
 * The build-time environment the web app reads. Vite only exposes variables prefixed VITE_; add them
 * here (with a default where one is safe) so a bad value stops the app at start-up with a clear list.
 */
const EnvSchema = z.object({
  MODE: z.string().min(1),
  BASE_URL: z.string().min(1),
  DEV: z.boolean(),
  PROD: z.boolean(),
});

export type Env = z.infer<typeof EnvSchema>;

export function parseEnv(source: Record<string, unknown>): Env {
  const result = EnvSchema.safeParse(source);
  if (!result.success) {
    const badKeys = result.error.issues.map((issue) => `- ${issue.path.join('.')}: ${issue.message}`);
    throw new Error(`Invalid environment variables:\n${badKeys.join('\n')}`);
  }
  return result.data;
}

export const env = parseEnv(import.meta.env);
