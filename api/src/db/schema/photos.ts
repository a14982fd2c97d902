import { sql } from 'drizzle-orm';
import { check, doublePrecision, index, integer, pgEnum, pgTable, primaryKey, text, timestamp, unique, uuid } from 'drizzle-orm/pg-core';

import { PHOTO_DERIVATIVES } from '../../domain/photos/photo.schema.js';
import { companies } from './companies.js';
import { depthReadings, items, jobs, runs } from './jobs.js';
import { users } from './users.js';

/*
 * Photos are evidence: they cascade only with their job (a draft job deleted whole). When the item, run
 * or depth reading a photo shows is deleted, the photo stays on the job (SET NULL) rather than vanish.
 * Bytes live in object storage under generated keys; these rows hold the keys and what was read from
 * the file. GPS is stored for the company's own use and never leaves it.
 */

export const photoVariant = pgEnum('photo_variant', PHOTO_DERIVATIVES);

export const photos = pgTable(
  'photos',
  {
    id: uuid('id').primaryKey(),
    companyId: uuid('company_id')
      .notNull()
      .references(() => companies.id),
    jobId: uuid('job_id')
      .notNull()
      .references(() => jobs.id, { onDelete: 'cascade' }),
    itemId: uuid('item_id').references(() => items.id, { onDelete: 'set null' }),
    runId: uuid('run_id').references(() => runs.id, { onDelete: 'set null' }),
    depthReadingId: uuid('depth_reading_id').references(() => depthReadings.id, { onDelete: 'set null' }),
    caption: text('caption'),
    /** When the phone says the photo was taken. */
    clientTakenAt: timestamp('client_taken_at', { withTimezone: true }),
    /** EXIF DateTimeOriginal: the camera's local wall clock, which carries no zone. */
    exifTakenAt: timestamp('exif_taken_at', { withTimezone: false, mode: 'string' }),
    gpsLat: doublePrecision('gps_lat'),
    gpsLon: doublePrecision('gps_lon'),
    originalKey: text('original_key').notNull(),
    originalContentType: text('original_content_type').notNull(),
    originalBytes: integer('original_bytes').notNull(),
    /** Sanitised file name from the upload, for display only (keys are generated). */
    originalName: text('original_name'),
    /** Upright pixel size (EXIF orientation applied). */
    width: integer('width').notNull(),
    height: integer('height').notNull(),
    sha256: text('sha256').notNull(),
    uploadedByUserId: uuid('uploaded_by_user_id').references(() => users.id, { onDelete: 'set null' }),
    /** The client's id for the upload: a retried upload with the same id on the same job is not stored twice. */
    clientUploadId: text('client_upload_id'),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    deletedAt: timestamp('deleted_at', { withTimezone: true }),
  },
  (t) => [
    index('photos_job_id_deleted_at_idx').on(t.jobId, t.deletedAt),
    index('photos_company_id_idx').on(t.companyId),
    index('photos_item_id_idx').on(t.itemId),
    index('photos_run_id_idx').on(t.runId),
    index('photos_depth_reading_id_idx').on(t.depthReadingId),
    index('photos_uploaded_by_user_id_idx').on(t.uploadedByUserId),
    unique('photos_job_id_client_upload_id_key').on(t.jobId, t.clientUploadId),
    check('photos_one_target', sql`num_nonnulls(${t.itemId}, ${t.runId}, ${t.depthReadingId}) <= 1`),
    check('photos_gps_pair', sql`(${t.gpsLat} is null) = (${t.gpsLon} is null)`),
    check('photos_gps_range', sql`${t.gpsLat} is null or (${t.gpsLat} between -90 and 90 and ${t.gpsLon} between -180 and 180)`),
    check('photos_size_positive', sql`${t.width} > 0 and ${t.height} > 0 and ${t.originalBytes} >= 0`),
    check('photos_sha256_hex', sql`${t.sha256} ~ '^[0-9a-f]{64}$'`),
  ],
);

/** The resized, metadata-free copies of a photo that are shown and printed. */
export const photoDerivatives = pgTable(
  'photo_derivatives',
  {
    photoId: uuid('photo_id')
      .notNull()
      .references(() => photos.id, { onDelete: 'cascade' }),
    variant: photoVariant('variant').notNull(),
    key: text('key').notNull(),
    width: integer('width').notNull(),
    height: integer('height').notNull(),
    bytes: integer('bytes').notNull(),
    contentType: text('content_type').notNull(),
  },
  (t) => [
    primaryKey({ columns: [t.photoId, t.variant] }),
    check('photo_derivatives_size_positive', sql`${t.width} > 0 and ${t.height} > 0 and ${t.bytes} > 0`),
  ],
);

export type Photo = typeof photos.$inferSelect;
export type NewPhoto = typeof photos.$inferInsert;
export type PhotoDerivative = typeof photoDerivatives.$inferSelect;
export type NewPhotoDerivative = typeof photoDerivatives.$inferInsert;
