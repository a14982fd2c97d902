import { z } from 'zod';

import { LabelSchema, PlanCoordinateSchema } from '../as-built/common.schema.js';
import { cursorPageSchemaOf, cursorPageShape, refineCursorPage } from '../paging/page.schema.js';

const Text120 = z.string().trim().max(120);
const Required120 = z.string().trim().min(1, { error: 'is required' }).max(120);
const Pixel = z.number().finite().min(0).max(100_000);

/** Two points on the site-plan image (pixels) and the real distance between them (metres). */
export const PlanCalibrationSchema = z
  .object({
    a: z.object({ x: Pixel, y: Pixel }),
    b: z.object({ x: Pixel, y: Pixel }),
    distanceM: z.number().finite().positive().max(10_000),
  })
  .refine((c) => c.a.x !== c.b.x || c.a.y !== c.b.y, { error: 'the two calibration points must differ', path: ['b'] });
export type PlanCalibration = z.infer<typeof PlanCalibrationSchema>;

const siteFields = {
  customerId: z.uuid(),
  label: Required120,
  addressLine1: Required120,
  addressLine2: Text120.nullable().optional(),
  city: Required120,
  region: Text120.nullable().optional(),
  postalCode: z.string().trim().max(20).nullable().optional(),
  country: Required120,
  /** True bearing of the plan's +y axis, degrees clockwise from true north. */
  northAzimuthDeg: z.number().finite().min(-360).max(360).optional(),
  origin: z
    .object({ lat: z.number().finite().min(-89.9).max(89.9), lon: z.number().finite().min(-180).max(180) })
    .nullable()
    .optional(),
  /** Set by uploading the image (PUT /api/sites/:id/plan-image), never by name: refused here. */
  planImageRef: z.never({ error: 'is set by uploading the image to PUT /api/sites/:id/plan-image' }).optional(),
  /** Pixels of the uploaded plan image; refused (400) while the site has no image. */
  planCalibration: PlanCalibrationSchema.nullable().optional(),
  notes: z.string().max(2000).nullable().optional(),
};

export const CreateSiteSchema = z.object({
  ...siteFields,
  planCalibration: z.never({ error: 'upload the plan image first (PUT /api/sites/:id/plan-image), then calibrate it' }).optional(),
});
export type CreateSiteInput = z.infer<typeof CreateSiteSchema>;

export const UpdateSiteSchema = z
  .object(siteFields)
  .partial()
  .refine((v) => Object.keys(v).length > 0, { error: 'nothing to change' });
export type UpdateSiteInput = z.infer<typeof UpdateSiteSchema>;

/**
 * `GET /api/sites`: `q` searches label, address, city and customer; `customerId` keeps one customer's; by
 * label, a page at a time (`page` or `cursor`, `pageSize`).
 */
export const SiteListQuerySchema = refineCursorPage(
  z.object({
    q: z.string().trim().max(120).optional(),
    customerId: z.uuid().optional(),
    ...cursorPageShape,
  }),
);
export type SiteListQuery = z.infer<typeof SiteListQuerySchema>;

export const CreateReferencePointSchema = z.object({
  label: LabelSchema,
  x: PlanCoordinateSchema,
  y: PlanCoordinateSchema,
  notes: z.string().max(2000).nullable().optional(),
});
export type CreateReferencePointInput = z.infer<typeof CreateReferencePointSchema>;

export const UpdateReferencePointSchema = CreateReferencePointSchema.partial().refine((v) => Object.keys(v).length > 0, {
  error: 'nothing to change',
});
export type UpdateReferencePointInput = z.infer<typeof UpdateReferencePointSchema>;

export const LinkHomeownerSchema = z.object({ userId: z.uuid() });
export type LinkHomeownerInput = z.infer<typeof LinkHomeownerSchema>;

export const ReferencePointResponseSchema = z.object({
  id: z.string(),
  label: z.string(),
  x: z.number(),
  y: z.number(),
  notes: z.string().nullable(),
});
export type ReferencePointResponse = z.infer<typeof ReferencePointResponseSchema>;

export const SiteSummaryResponseSchema = z.object({
  id: z.string(),
  label: z.string(),
  customer: z.object({ id: z.string(), name: z.string() }),
  addressLine1: z.string(),
  addressLine2: z.string().nullable(),
  city: z.string(),
  region: z.string().nullable(),
  postalCode: z.string().nullable(),
  country: z.string(),
});
export type SiteSummaryResponse = z.infer<typeof SiteSummaryResponseSchema>;

export const SitePageSchema = cursorPageSchemaOf(SiteSummaryResponseSchema);

/** The uploaded site-plan image: its stored size (the calibration's pixel space) and where to fetch it. */
export const PlanImageResponseSchema = z.object({
  widthPx: z.number(),
  heightPx: z.number(),
  contentType: z.string(),
  /** `/api/sites/:id/plan-image?v=<hash>`; `v` changes whenever the image is replaced. */
  url: z.string(),
});
export type PlanImageResponse = z.infer<typeof PlanImageResponseSchema>;

export const SiteResponseSchema = SiteSummaryResponseSchema.extend({
  northAzimuthDeg: z.number(),
  origin: z.object({ lat: z.number(), lon: z.number() }).nullable(),
  planImage: PlanImageResponseSchema.nullable(),
  planCalibration: PlanCalibrationSchema.nullable(),
  notes: z.string().nullable(),
  referencePoints: z.array(ReferencePointResponseSchema),
  homeowners: z.array(z.object({ id: z.string(), name: z.string(), email: z.string() })),
  jobs: z.array(z.object({ id: z.string(), title: z.string(), status: z.string(), revision: z.number(), updatedAt: z.string() })),
  /** Optimistic lock: send it as `If-Match` with the next write to the site (also the GET's `ETag`). */
  version: z.number().int(),
  createdAt: z.string(),
  updatedAt: z.string(),
});
export type SiteResponse = z.infer<typeof SiteResponseSchema>;

/** After a plan-image upload: the site, and whether an old calibration was dropped (its pixels no longer apply). */
export const PlanImageUploadResponseSchema = SiteResponseSchema.extend({ wasCalibrationCleared: z.boolean() });
export type PlanImageUploadResponse = z.infer<typeof PlanImageUploadResponseSchema>;

/** What every versioned site write answers with, besides its own result. */
export const SiteVersionResponseSchema = z.object({
  /** The site's version after the write: send it as `If-Match` with the next one. */
  siteVersion: z.number().int(),
  /** The new version of every open job on the site a geometry write bumped (job id → version). */
  jobVersions: z.record(z.string(), z.number().int()),
});
export type SiteVersionResponse = z.infer<typeof SiteVersionResponseSchema>;

export const HomeownerListResponseSchema = SiteResponseSchema.shape.homeowners;

/** Largest plan-image upload, bytes. */
export const PLAN_IMAGE_MAX_BYTES = 20 * 1024 * 1024;
/** Longest side of the stored plan image, and of the copy drawings embed, pixels. */
export const PLAN_IMAGE_MAX_SIDE_PX = 4000;
export const PLAN_IMAGE_SCREEN_SIDE_PX = 2000;
