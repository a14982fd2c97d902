import { z } from 'zod';

export const OutboxQuerySchema = z.object({
  page: z.coerce.number().int().min(1).max(10_000).default(1),
  pageSize: z.coerce.number().int().min(1).max(100).default(25),
});
export type OutboxQuery = z.infer<typeof OutboxQuerySchema>;

export const OutboxMessageSummarySchema = z.object({
  id: z.uuid(),
  from: z.string(),
  to: z.array(z.string()),
  subject: z.string(),
  receivedAt: z.string(),
});
export type OutboxMessageSummary = z.infer<typeof OutboxMessageSummarySchema>;

export const OutboxListResponseSchema = z.object({
  items: z.array(OutboxMessageSummarySchema),
  total: z.number().int(),
  page: z.number().int(),
  pageSize: z.number().int(),
});
export type OutboxListResponse = z.infer<typeof OutboxListResponseSchema>;

export const OutboxMessageResponseSchema = OutboxMessageSummarySchema.extend({
  text: z.string().nullable(),
  html: z.string().nullable(),
  headers: z.record(z.string(), z.string()),
  attachments: z.array(z.object({ id: z.uuid(), filename: z.string(), contentType: z.string(), sizeBytes: z.number() })),
});
export type OutboxMessageResponse = z.infer<typeof OutboxMessageResponseSchema>;
