import { z } from 'zod';

const PacketFileSchema = z.object({ bytes: z.number().int(), sha256: z.string(), url: z.string() });

/** One packet revision and its render status (`GET /api/packets/:id`, the job's list of revisions). */
export const PacketRevisionResponseSchema = z.object({
  id: z.string(),
  jobId: z.string(),
  revision: z.number().int(),
  status: z.enum(['queued', 'rendering', 'ready', 'failed']),
  failureReason: z.string().nullable(),
  attempts: z.number().int(),
  paperSize: z.enum(['letter', 'a4']),
  pageCount: z.number().int().nullable(),
  pdf: PacketFileSchema.nullable(),
  archive: PacketFileSchema.nullable(),
  issuedByUserId: z.string().nullable(),
  issuedAt: z.string(),
  renderedAt: z.string().nullable(),
});
export type PacketRevisionResponse = z.infer<typeof PacketRevisionResponseSchema>;

/** Something the office should know about an issued packet; the packet is issued all the same. */
export const IssueWarningSchema = z.object({ code: z.literal('PACKET_WITHOUT_PHONE'), message: z.string() });
export type IssueWarning = z.infer<typeof IssueWarningSchema>;

export const IssuePacketResponseSchema = PacketRevisionResponseSchema.extend({
  /** The job's version after issuing (it is now `issued`). */
  jobVersion: z.number().int(),
  /** Warnings about the issued packet (e.g. no contact phone in the company profile). */
  warnings: z.array(IssueWarningSchema),
});
export type IssuePacketResponse = z.infer<typeof IssuePacketResponseSchema>;
