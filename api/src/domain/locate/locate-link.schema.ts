import { z } from 'zod';

import { SiteMapSchema } from './site-map.schema.js';

/** POST /api/sites/:siteId/locate-links */
export const CreateLocateLinkSchema = z
  .object({
    expiresInDays: z.number().int().min(1).max(365),
    note: z.string().trim().max(500).optional(),
  })
  .strict();
export type CreateLocateLinkInput = z.infer<typeof CreateLocateLinkSchema>;

/** A locate link as its owner sees it (never the token, which is shown once at creation). */
export const LocateLinkResponseSchema = z.object({
  id: z.uuid(),
  siteId: z.uuid(),
  note: z.string().nullable(),
  createdBy: z.object({ id: z.uuid(), name: z.string() }).nullable(),
  createdAt: z.string(),
  expiresAt: z.string(),
  revokedAt: z.string().nullable(),
  /** The link made when a packet was issued (printed as the packet's QR code). */
  isLongLived: z.boolean(),
  /** Usable now: neither expired nor revoked. */
  isActive: z.boolean(),
  accessCount: z.number().int(),
  lastAccessedAt: z.string().nullable(),
});
export type LocateLinkResponse = z.infer<typeof LocateLinkResponseSchema>;

/** The answer to a create: the link plus its URL with the token, shown this once. */
export const CreatedLocateLinkResponseSchema = LocateLinkResponseSchema.extend({ url: z.url(), token: z.string() });
export type CreatedLocateLinkResponse = z.infer<typeof CreatedLocateLinkResponseSchema>;

export const LocatePhotoSchema = z.object({
  id: z.uuid(),
  caption: z.string().nullable(),
  takenAt: z.string().nullable(),
  /** Metadata-stripped derivatives only (no EXIF, no GPS). */
  thumbUrl: z.string(),
  screenUrl: z.string(),
});

export const LocateRunSchema = z.object({
  id: z.string(),
  label: z.string(),
  cable: z.string(),
  gauge: z.string(),
  method: z.enum(['direct_burial', 'conduit', 'under_hardscape_sleeve', 'indoor']),
  minDepthM: z.number().nullable(),
  maxDepthM: z.number().nullable(),
  /** The depth rule's minimum cover, metres (null when none applies), and whether any reading is shallower. */
  minCoverM: z.number().nullable(),
  isShallow: z.boolean(),
  isSpare: z.boolean(),
  isAbandoned: z.boolean(),
  revision: z.number().int(),
  /** Provenance (issue 21): when the run went in (ISO date; null when unknown), by which job, and abandoned since when. */
  installedOn: z.string().nullable().optional(),
  installedByJobTitle: z.string().optional(),
  abandonedOn: z.string().nullable().optional(),
  depthProfileUrl: z.string(),
  photos: z.array(LocatePhotoSchema),
});

export const CautionSchema = z.object({ title: z.string(), body: z.string() });

/**
 * GET /api/locate/:token — the public, read-only view for someone about to dig. The street address is
 * included on purpose: the person digging is standing at it. No customer, crew, notes or serials.
 */
export const LocateViewResponseSchema = z.object({
  site: z.object({
    label: z.string(),
    addressLine1: z.string(),
    addressLine2: z.string().nullable(),
    city: z.string(),
    region: z.string().nullable(),
    postalCode: z.string().nullable(),
    country: z.string(),
    northAzimuthDeg: z.number(),
  }),
  installer: z.object({
    companyName: z.string(),
    phone: z.string().nullable(),
    email: z.string().nullable(),
    licenceNumbers: z.array(z.string()),
  }),
  /** The packet's locate-before-digging steps and safety cautions, same words, tolerance zone filled in. */
  locateSteps: z.array(CautionSchema),
  cautions: z.array(CautionSchema),
  /** The same one-line summary the packet e-mail carries. */
  cautionSummary: z.string(),
  toleranceZoneM: z.number(),
  units: z.enum(['imperial', 'metric']),
  /** The company's BCP 47 locale (spelling of the screen's own words: en-US "center", en-GB "centre"). */
  locale: z.string(),
  /** The company's IANA time zone (null until chosen): the screen writes the link's dates in it, as the packet does. */
  timeZone: z.string().nullable(),
  map: SiteMapSchema,
  runs: z.array(LocateRunSchema),
  /** null when the site has no GPS origin (the map is in plan coordinates only). */
  geojsonUrl: z.string().nullable(),
  /** The one-page printable locate sheet (PDF) of this link. */
  sheetUrl: z.string(),
  link: z.object({ expiresAt: z.string(), note: z.string().nullable() }),
  generatedAt: z.string(),
});
export type LocateViewResponse = z.infer<typeof LocateViewResponseSchema>;

/** Every refusal of a public locate request (unknown, expired or revoked token): a 404 with this code only. */
export const LOCATE_LINK_NOT_VALID = 'LOCATE_LINK_NOT_VALID';
