import { z } from 'zod';

import { EmailSchema } from '../auth/auth.schema.js';

/** Most recipients one send may have (the dialog's homeowners and added addresses together). */
export const MAX_SEND_RECIPIENTS = 20;

/** How the packet goes: the PDF attached (within MAIL_MAX_ATTACHMENT_BYTES; else link only), or the portal link only. */
export const PdfDeliveryModeSchema = z.enum(['attached', 'link']);
export type PdfDeliveryMode = z.infer<typeof PdfDeliveryModeSchema>;

/** POST /api/packets/:id/send */
export const SendPacketSchema = z
  .object({
    /**
     * The recipients: one address or a list. Each is linked to the site as its homeowner, or invited to
     * the portal when they have no account (the invitation link goes in the packet e-mail). Omitted:
     * every homeowner linked to (or invited for) the site.
     */
    to: z
      .union([EmailSchema, z.array(EmailSchema).min(1, { error: 'give at least one recipient' }).max(MAX_SEND_RECIPIENTS)])
      .transform((to) => [...new Set(Array.isArray(to) ? to : [to])])
      .optional(),
    cc: z.array(EmailSchema).max(5).optional(),
    message: z.string().trim().max(1000).optional(),
    /** Default `attached`. */
    pdf: PdfDeliveryModeSchema.optional(),
  })
  .strict();
export type SendPacketInput = z.input<typeof SendPacketSchema>;
export type SendPacketParsed = z.output<typeof SendPacketSchema>;

export const DeliveryStatusSchema = z.enum(['queued', 'sending', 'sent', 'failed']);
export type DeliveryStatus = z.infer<typeof DeliveryStatusSchema>;

/** One e-mail of a revision to one recipient (GET /api/packets/:id/deliveries, newest first). */
export const PacketDeliveryResponseSchema = z.object({
  id: z.uuid(),
  revisionId: z.uuid(),
  to: z.string(),
  cc: z.array(z.string()),
  message: z.string().nullable(),
  status: DeliveryStatusSchema,
  attempts: z.number().int(),
  /** The error of the last failed attempt as the mail server or network gave it (for support). */
  lastError: z.string().nullable(),
  /** The same in plain words for the office (null when no attempt failed). */
  failureReason: z.string().nullable(),
  /** The sender's choice (the PDF still goes as a link when it is over the attachment limit). */
  pdf: PdfDeliveryModeSchema,
  /** null until sent; false when the e-mail carried the link only (chosen, or the PDF was over the limit). */
  isPdfAttached: z.boolean().nullable(),
  messageId: z.string().nullable(),
  /** An invitation to the portal goes in this e-mail (the recipient had no account). */
  isInvited: z.boolean(),
  requestedByUserId: z.uuid().nullable(),
  createdAt: z.string(),
  updatedAt: z.string(),
  sentAt: z.string().nullable(),
  /** A failed delivery set aside by the office (no longer shown as needing attention). */
  dismissedAt: z.string().nullable(),
});
export type PacketDeliveryResponse = z.infer<typeof PacketDeliveryResponseSchema>;

/** 202 answer of a send: one queued delivery per recipient. */
export const SendPacketResponseSchema = z.object({ deliveries: z.array(PacketDeliveryResponseSchema) });
export type SendPacketResponse = z.infer<typeof SendPacketResponseSchema>;

/** A delivery with the revision, job and site it belongs to (GET /api/jobs/:jobId/deliveries, GET /api/deliveries/failed). */
export const DeliveryInContextSchema = PacketDeliveryResponseSchema.extend({
  revision: z.number().int(),
  jobId: z.uuid(),
  jobTitle: z.string(),
  siteId: z.uuid(),
  siteLabel: z.string(),
});
export type DeliveryInContext = z.infer<typeof DeliveryInContextSchema>;

/** What the send dialog starts from (GET /api/packets/:id/send-options). */
export const SendOptionsResponseSchema = z.object({
  /** The site's homeowners: linked accounts, then people invited who have not accepted yet. */
  homeowners: z.array(z.object({ email: z.string(), name: z.string().nullable(), hasAccount: z.boolean() })),
  pdfBytes: z.number().int().nullable(),
  maxAttachmentBytes: z.number().int(),
  /** False when the PDF is over MAIL_MAX_ATTACHMENT_BYTES: the e-mail carries the link only. */
  canAttachPdf: z.boolean(),
});
export type SendOptionsResponse = z.infer<typeof SendOptionsResponseSchema>;
