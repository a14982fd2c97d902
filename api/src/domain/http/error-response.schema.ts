import { z } from 'zod';

/**
 * The body of every non-2xx answer of the API (`HttpExceptionFilter`): Nest's default
 * `{ statusCode, error, message }`, a stable `code` when there is one, `issues` naming each bad field
 * of a 400, and `currentVersion` with `VERSION_CONFLICT` (412) so the client can reload or merge.
 */
export const ErrorResponseSchema = z
  .object({
    statusCode: z.number().int(),
    error: z.string(),
    message: z.string(),
    code: z.string().optional(),
    issues: z.array(z.object({ path: z.string(), message: z.string() })).optional(),
    currentVersion: z.number().int().optional(),
  })
  // Some errors add their own facts (the jobs that block a change, a finding's id): clients read what they know.
  .loose();
export type ErrorResponse = z.infer<typeof ErrorResponseSchema>;
