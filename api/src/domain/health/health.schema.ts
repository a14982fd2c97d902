import { z } from 'zod';

/** `GET /api/health`: 200 with status "ok" when the API and its database answer, 503 otherwise. */
export const HealthResponseSchema = z.object({
  status: z.enum(['ok', 'error']),
  database: z.discriminatedUnion('status', [
    z.object({ status: z.literal('up'), latencyMs: z.number() }),
    z.object({ status: z.literal('down'), error: z.string() }),
  ]),
  version: z.string(),
  uptimeSeconds: z.number(),
});

export type HealthResponse = z.infer<typeof HealthResponseSchema>;
