import { z } from 'zod';

export const SIGNATURE_ROLES = ['lead', 'homeowner'] as const;
export type SignatureRole = (typeof SIGNATURE_ROLES)[number];

/** The largest SVG path data accepted for one signature (200 kB). */
export const MAX_SIGNATURE_PATH_CHARS = 200_000;

/** SVG path data only (move, line, cubic and quadratic curves, close): nothing that can carry markup. */
const SVG_PATH_DATA = /^[MmLlCcQqZz0-9.,\s-]+$/;

/** A finger-drawn signature, as the lead's device sends it: path data in a 0 0 400 120 box. */
export const SignatureInputSchema = z
  .object({
    signerName: z.string().trim().min(1, 'must not be empty').max(120, 'must be at most 120 characters'),
    svgPath: z
      .string()
      .max(MAX_SIGNATURE_PATH_CHARS, 'must be at most 200 kB')
      .regex(SVG_PATH_DATA, 'must be SVG path data (M, L, C, Q, Z and numbers)')
      .refine((d) => /[0-9]/.test(d), 'must draw something'),
    /** When it was signed on the device; the server's time when omitted. Not in the future. */
    signedAt: z.iso
      .datetime({ offset: true })
      .optional()
      .refine((v) => v === undefined || Date.parse(v) <= Date.now() + 5 * 60_000, 'must not be in the future'),
    expectedVersion: z.number().int().min(1).optional(),
  })
  .strict();
export type SignatureInput = z.infer<typeof SignatureInputSchema>;

export const JobSignatureResponseSchema = z.object({
  role: z.enum(SIGNATURE_ROLES),
  signerName: z.string(),
  signedAt: z.string(),
  svgPath: z.string(),
  capturedByUserId: z.string().nullable(),
});
export type JobSignatureResponse = z.infer<typeof JobSignatureResponseSchema>;

/** Saving a signature answers it and the job's new version. */
export const SignatureWriteResponseSchema = z.object({ signature: JobSignatureResponseSchema, jobVersion: z.number().int() });
export type SignatureWriteResponse = z.infer<typeof SignatureWriteResponseSchema>;
