import { z } from 'zod';

/** The sizes every upload is turned into. The original is kept as uploaded and served only to staff. */
export const PHOTO_DERIVATIVES = ['thumb', 'screen', 'print'] as const;
export type PhotoDerivativeVariant = (typeof PHOTO_DERIVATIVES)[number];

export const PHOTO_VARIANTS = [...PHOTO_DERIVATIVES, 'original'] as const;
export type PhotoVariant = (typeof PHOTO_VARIANTS)[number];

/** What a photo shows: the job as a whole, or one item (wall entries are items), run or depth reading. */
export const PHOTO_TARGET_TYPES = ['job', 'item', 'run', 'depth_reading'] as const;
export type PhotoTargetType = (typeof PHOTO_TARGET_TYPES)[number];

export const PhotoTargetSchema = z.discriminatedUnion('type', [
  z.object({ type: z.literal('job') }),
  z.object({ type: z.enum(['item', 'run', 'depth_reading']), id: z.uuid() }),
]);
export type PhotoTarget = z.infer<typeof PhotoTargetSchema>;

const CaptionSchema = z
  .string()
  .trim()
  .max(500)
  .transform((caption) => (caption === '' ? null : caption));

/** The earliest taken-at date accepted (no job photo in this product predates it). */
export const PHOTO_TAKEN_AT_EARLIEST = '1990-01-01T00:00:00Z';
/** How far past the server's clock a taken-at date may lie (phones with a wrong time zone or clock). */
export const PHOTO_TAKEN_AT_FUTURE_SLACK_MS = 24 * 60 * 60 * 1000;

/**
 * When the photo was taken, as the phone reports it (ISO 8601 with an offset or Z), between 1990 and a
 * day after now: a year 9999 would sort every list wrong and print in the packet as a fact.
 */
const TakenAtSchema = z.iso
  .datetime({ offset: true })
  .refine((value) => Date.parse(value) >= Date.parse(PHOTO_TAKEN_AT_EARLIEST), {
    message: 'must not be before 1 January 1990',
  })
  .refine((value) => Date.parse(value) <= Date.now() + PHOTO_TAKEN_AT_FUTURE_SLACK_MS, {
    message: 'must not be more than a day in the future',
  });

/** One text field of a multipart form, which clients may send as JSON (`target={"type":"run",…}`). */
const jsonField = <T extends z.ZodType>(schema: T) =>
  z.preprocess((value) => {
    if (typeof value !== 'string') return value;
    try {
      return JSON.parse(value);
    } catch {
      return value;
    }
  }, schema);

/**
 * The text fields of `POST /api/jobs/:jobId/photos` (multipart/form-data). `clientUploadId` is the
 * client's own id for each file, in the order of the files (repeat the field for several files): an
 * upload retried with the same ids is answered with the photos already stored instead of new copies.
 * The job version goes in the `If-Match` header (multipart bodies carry no numbers).
 */
export const UploadPhotosFieldsSchema = z.object({
  caption: CaptionSchema.optional(),
  takenAt: TakenAtSchema.optional(),
  target: jsonField(PhotoTargetSchema).optional(),
  clientUploadId: z
    .preprocess(
      (value) => (value === undefined ? undefined : Array.isArray(value) ? value : [value]),
      z.array(z.string().trim().regex(/^[A-Za-z0-9._:-]{1,100}$/, 'letters, digits, . _ : - only (at most 100)')),
    )
    .optional(),
});
export type UploadPhotosFields = z.infer<typeof UploadPhotosFieldsSchema>;

export const UpdatePhotoSchema = z
  .object({
    caption: CaptionSchema.nullable().optional(),
    takenAt: TakenAtSchema.nullable().optional(),
    target: PhotoTargetSchema.optional(),
    expectedVersion: z.number().int().min(1).optional(),
  })
  .refine((body) => body.caption !== undefined || body.takenAt !== undefined || body.target !== undefined, {
    message: 'send at least one of caption, takenAt, target',
  });
export type UpdatePhotoInput = z.infer<typeof UpdatePhotoSchema>;

export const PhotoDerivativeResponseSchema = z.object({
  url: z.string(),
  width: z.number(),
  height: z.number(),
  bytes: z.number(),
  contentType: z.string(),
});
export type PhotoDerivativeResponse = z.infer<typeof PhotoDerivativeResponseSchema>;

export const PhotoResponseSchema = z.object({
  id: z.string(),
  jobId: z.string(),
  target: PhotoTargetSchema,
  caption: z.string().nullable(),
  /** The client's taken-at when sent, otherwise the camera's EXIF time (its local clock, no zone). */
  takenAt: z.string().nullable(),
  clientTakenAt: z.string().nullable(),
  /** EXIF DateTimeOriginal as the camera wrote it: local wall-clock time without a zone. */
  exifTakenAt: z.string().nullable(),
  /** EXIF GPS position. Company staff only: never put it in anything that leaves the company. */
  exifLocation: z.object({ lat: z.number(), lon: z.number() }).nullable(),
  width: z.number(),
  height: z.number(),
  original: z.object({ contentType: z.string(), bytes: z.number(), sha256: z.string(), name: z.string().nullable(), url: z.string().nullable() }),
  derivatives: z.record(z.enum(PHOTO_DERIVATIVES), PhotoDerivativeResponseSchema),
  uploadedBy: z.object({ id: z.string(), name: z.string() }).nullable(),
  createdAt: z.string(),
  deletedAt: z.string().nullable(),
});
export type PhotoResponse = z.infer<typeof PhotoResponseSchema>;

export const UploadPhotosResponseSchema = z.object({
  photos: z.array(PhotoResponseSchema),
  /** True when every file had been stored before under its clientUploadId (a retried upload). */
  isReplay: z.boolean(),
  jobVersion: z.number().int(),
});
export type UploadPhotosResponse = z.infer<typeof UploadPhotosResponseSchema>;

export const PhotoListResponseSchema = z.object({ items: z.array(PhotoResponseSchema) });
export type PhotoListResponse = z.infer<typeof PhotoListResponseSchema>;

/** `GET /api/jobs/:jobId/photos`: `includeDeleted=true` lists soft-deleted photos too (for undo). */
export const PhotoListQuerySchema = z.object({ includeDeleted: z.enum(['true', 'false']).optional() });

/** A photo write (caption, target, delete, restore) answers the photo and the job's new version. */
export const PhotoWriteResponseSchema = z.object({ photo: PhotoResponseSchema, jobVersion: z.number().int() });
export type PhotoWriteResponse = z.infer<typeof PhotoWriteResponseSchema>;
