import { sql } from 'drizzle-orm';
import {
  bigserial,
  check,
  doublePrecision,
  index,
  integer,
  jsonb,
  pgTable,
  primaryKey,
  text,
  timestamp,
  uuid,
} from 'drizzle-orm/pg-core';

import { companies } from './companies.js';
import { customers } from './customers.js';
import { users } from './users.js';

/**
 * A property where work is done. The site frame (north direction, GPS origin) and the site-plan scale
 * calibration are plain columns: two points on the plan image (pixels) and the real distance between
 * them give metres per pixel.
 */
export const sites = pgTable(
  'sites',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    companyId: uuid('company_id')
      .notNull()
      .references(() => companies.id),
    // A customer with sites cannot be deleted (no action): their history stays attached.
    customerId: uuid('customer_id')
      .notNull()
      .references(() => customers.id),
    label: text('label').notNull(),
    addressLine1: text('address_line1').notNull(),
    addressLine2: text('address_line2'),
    city: text('city').notNull(),
    region: text('region'),
    postalCode: text('postal_code'),
    country: text('country').notNull(),
    /** True bearing of the plan's +y axis, degrees clockwise from true north (0 = plan drawn north-up). */
    northAzimuthDeg: doublePrecision('north_azimuth_deg').notNull().default(0),
    /** WGS84 position of plan (0, 0); both or neither. */
    originLat: doublePrecision('origin_lat'),
    originLon: doublePrecision('origin_lon'),
    /** Storage key of the uploaded site-plan image (normalised: upright, no metadata, ≤ 4000 px). */
    planImageRef: text('plan_image_ref'),
    /** Storage key of the screen-size copy (≤ 2000 px JPEG) that drawings embed. */
    planImageScreenRef: text('plan_image_screen_ref'),
    /** Size of the stored image in pixels: the calibration points are in this pixel space. */
    planImageWidthPx: integer('plan_image_width_px'),
    planImageHeightPx: integer('plan_image_height_px'),
    planImageContentType: text('plan_image_content_type'),
    planCalAx: doublePrecision('plan_cal_a_x'),
    planCalAy: doublePrecision('plan_cal_a_y'),
    planCalBx: doublePrecision('plan_cal_b_x'),
    planCalBy: doublePrecision('plan_cal_b_y'),
    /** Real distance between calibration points A and B, metres. */
    planCalDistanceM: doublePrecision('plan_cal_distance_m'),
    notes: text('notes'),
    /**
     * Optimistic lock, as `jobs.version`: every write to the site or its reference points names it
     * (If-Match) and bumps it (SiteWriter).
     */
    version: integer('version').notNull().default(1),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index('sites_company_id_label_idx').on(t.companyId, t.label),
    index('sites_customer_id_idx').on(t.customerId),
    check('sites_version_positive', sql`${t.version} >= 1`),
    check('sites_origin_complete', sql`(${t.originLat} is null) = (${t.originLon} is null)`),
    check(
      'sites_plan_image_complete',
      sql`(${t.planImageRef} is null) = (${t.planImageScreenRef} is null) and (${t.planImageRef} is null) = (${t.planImageWidthPx} is null)
        and (${t.planImageRef} is null) = (${t.planImageHeightPx} is null) and (${t.planImageRef} is null) = (${t.planImageContentType} is null)`,
    ),
    check('sites_plan_calibration_needs_image', sql`${t.planCalDistanceM} is null or ${t.planImageRef} is not null`),
    check(
      'sites_plan_calibration_complete',
      sql`(${t.planCalAx} is null) = (${t.planCalDistanceM} is null) and (${t.planCalAy} is null) = (${t.planCalDistanceM} is null)
        and (${t.planCalBx} is null) = (${t.planCalDistanceM} is null) and (${t.planCalBy} is null) = (${t.planCalDistanceM} is null)`,
    ),
  ],
);

/** Homeowner accounts and the sites they may see (PRODUCT: a homeowner sees only their own sites). */
export const siteHomeowners = pgTable(
  'site_homeowners',
  {
    siteId: uuid('site_id')
      .notNull()
      .references(() => sites.id, { onDelete: 'cascade' }),
    userId: uuid('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [primaryKey({ columns: [t.siteId, t.userId] }), index('site_homeowners_user_id_idx').on(t.userId)],
);

/**
 * Fixed points of the site (house corners, gate posts, meter base) that ties are taped from. They belong
 * to the site, not a job, so later jobs reuse them; a point still tied to by an item cannot be deleted.
 */
export const referencePoints = pgTable(
  'reference_points',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    siteId: uuid('site_id')
      .notNull()
      .references(() => sites.id, { onDelete: 'cascade' }),
    /** Insertion order, so lists (and as-built paths) are stable. */
    seq: bigserial('seq', { mode: 'number' }).notNull(),
    label: text('label').notNull(),
    x: doublePrecision('x').notNull(),
    y: doublePrecision('y').notNull(),
    notes: text('notes'),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('reference_points_site_id_idx').on(t.siteId, t.seq)],
);

/**
 * Landmarks on the site plan (house footprint, fences, walls, patios, paths, pools, spas, driveways,
 * trees, beds): named outlines or lines in plan metres, `[{ x, y }, …]`. They belong to the site, so they
 * outlive jobs; every map and drawing of the site draws them under the runs.
 */
export const siteFeatures = pgTable(
  'site_features',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    siteId: uuid('site_id')
      .notNull()
      .references(() => sites.id, { onDelete: 'cascade' }),
    /** Insertion order: drawn in this order (later on top) and listed in it. */
    seq: bigserial('seq', { mode: 'number' }).notNull(),
    kind: text('kind').notNull(),
    name: text('name').notNull(),
    shape: text('shape').notNull(),
    points: jsonb('points').$type<{ x: number; y: number }[]>().notNull(),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index('site_features_site_id_idx').on(t.siteId, t.seq),
    check(
      'site_features_kind_known',
      sql`${t.kind} in ('house', 'outbuilding', 'fence', 'wall', 'patio', 'path', 'pool', 'spa', 'driveway', 'tree', 'bed', 'other')`,
    ),
    check('site_features_shape_known', sql`${t.shape} in ('polygon', 'line')`),
    check(
      'site_features_points_enough',
      sql`jsonb_typeof(${t.points}) = 'array' and jsonb_array_length(${t.points}) >= (case when ${t.shape} = 'polygon' then 3 else 2 end)`,
    ),
  ],
);

export type Site = typeof sites.$inferSelect;
export type SiteFeatureRow = typeof siteFeatures.$inferSelect;
export type NewSiteFeatureRow = typeof siteFeatures.$inferInsert;
export type NewSite = typeof sites.$inferInsert;
export type SiteHomeowner = typeof siteHomeowners.$inferSelect;
export type ReferencePointRow = typeof referencePoints.$inferSelect;
export type NewReferencePointRow = typeof referencePoints.$inferInsert;
