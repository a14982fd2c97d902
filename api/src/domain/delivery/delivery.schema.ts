import { z } from 'zod';

import { EmailSchema } from '../auth/auth.schema.js';

/** POST /api/packets/:id/send */
export const SendPacketSchema = z
  .object({
    /**
     * The recipient when the site has no homeowner yet (or another homeowner to add): they are linked
     * to the site, or invited as its homeowner when they have no account. Omitted: every homeowner
     * linked to (or invited for) the site.
     */
    to: EmailSchema.optional(),
    cc: z.array(EmailSchema).max(5).optional(),
    message: z.string().trim().max(1000).optional(),
  })
  .strict();
export type SendPacketInput = z.infer<typeof SendPacketSchema>;

export const DeliveryStatusSchema = z.enum(['queued', 'sending', 'sent', 'failed']);

/** One e-mail of a revision (GET /api/packets/:id/deliveries, newest first). */
export const PacketDeliveryResponseSchema = z.object({
  id: z.uuid(),
  revisionId: z.uuid(),
  to: z.string(),
  cc: z.array(z.string()),
  message: z.string().nullable(),
  status: DeliveryStatusSchema,
  attempts: z.number().int(),
  lastError: z.string().nullable(),
  /** null until sent; false when the PDF was over the attachment limit (the e-mail links to it). */
  isPdfAttached: z.boolean().nullable(),
  messageId: z.string().nullable(),
  /** An invitation to the portal went with this delivery (the recipient had no account). */
  isInvited: z.boolean(),
  requestedByUserId: z.uuid().nullable(),
  createdAt: z.string(),
  sentAt: z.string().nullable(),
});
export type PacketDeliveryResponse = z.infer<typeof PacketDeliveryResponseSchema>;

/** 202 answer of a send: one queued delivery per recipient. */
export const SendPacketResponseSchema = z.object({ deliveries: z.array(PacketDeliveryResponseSchema) });
export type SendPacketResponse = z.infer<typeof SendPacketResponseSchema>;
