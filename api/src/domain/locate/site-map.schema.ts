import { z } from 'zod';

/** A point on the site plan, metres (x to the plan's right, y to its top). */
export const PlanPointResponseSchema = z.object({ x: z.number(), y: z.number() });

const FromRevisionShape = {
  /** The packet revision this feature was taken from (its immutable snapshot). */
  revisionId: z.uuid(),
  revision: z.number().int(),
  jobId: z.uuid(),
  jobTitle: z.string(),
};

/**
 * Provenance of a run or item (issue 21): the job that installed it and its work date (ISO date; for
 * packets issued before provenance was kept, the work date of the revision's job, or null when
 * unknown), and since when it is abandoned in place. Always set by buildSiteMap.
 */
const ProvenanceShape = {
  installedByJobId: z.uuid().optional(),
  installedByJobTitle: z.string().optional(),
  installedOn: z.string().nullable().optional(),
  /** Abandoned in place since (ISO date), or null while in service or when not recorded. */
  abandonedOn: z.string().nullable().optional(),
};

export const SiteMapReferencePointSchema = z.object({ id: z.string(), label: z.string(), x: z.number(), y: z.number() });

export const SiteMapFeatureSchema = z.object({
  id: z.string(),
  kind: z.string(),
  name: z.string(),
  shape: z.enum(['polygon', 'line']),
  points: z.array(PlanPointResponseSchema),
});
export type SiteMapFeature = z.infer<typeof SiteMapFeatureSchema>;

export const SiteMapItemSchema = z.object({
  ...FromRevisionShape,
  ...ProvenanceShape,
  id: z.string(),
  kind: z.enum(['amplifier', 'speaker', 'subwoofer', 'junction', 'spare_end', 'wall_entry']),
  label: z.string(),
  /** Solved or placed plan position with its estimated accuracy; null when unlocated. */
  position: z.object({ x: z.number(), y: z.number(), source: z.enum(['ties', 'manual', 'gps']), accuracyM: z.number().nullable() }).nullable(),
  ties: z.array(z.object({ referencePointId: z.string(), distanceM: z.number() })),
  /** Only for `wall_entry`. */
  wallEntry: z
    .object({
      wallMaterial: z.string().nullable(),
      holeDiameterM: z.number().nullable(),
      sleeve: z.string().nullable(),
      sealant: z.string().nullable(),
      insideLocation: z.string().nullable(),
      outsideLocation: z.string().nullable(),
    })
    .nullable(),
  /** Only for `spare_end`. */
  isCapped: z.boolean().nullable(),
});

export const SiteMapRunSchema = z.object({
  ...FromRevisionShape,
  ...ProvenanceShape,
  id: z.string(),
  label: z.string(),
  fromItemId: z.string(),
  toItemId: z.string(),
  cableType: z.string(),
  gauge: z.string(),
  conductors: z.number().int(),
  method: z.enum(['direct_burial', 'conduit', 'under_hardscape_sleeve', 'indoor']),
  location: z.string(),
  measuredLengthM: z.number(),
  /** Recorded cover (top of cable to grade when installed), metres; null without readings. */
  minDepthM: z.number().nullable(),
  maxDepthM: z.number().nullable(),
  depthReadings: z.array(z.object({ stationM: z.number(), depthM: z.number() })),
  /** The minimum cover of the depth rule this run was checked against, metres; null when no rule applies (indoors, no rule). */
  minCoverM: z.number().nullable(),
  /** A live run with any reading shallower than that rule (the packet's depth check: a shallow station). */
  isShallow: z.boolean(),
  /** The drawn route, or the straight line between its end items when no route was drawn; null when unknown. */
  route: z.array(PlanPointResponseSchema).nullable(),
  isRouteDrawn: z.boolean(),
  isSpare: z.boolean(),
  isAbandoned: z.boolean(),
});

const PositionSchema = z.tuple([z.number(), z.number()]);

/** RFC 7946 FeatureCollection (WGS 84, [lon, lat]); plan coordinates are repeated in `properties`. */
export const SiteMapGeoJsonSchema = z.object({
  type: z.literal('FeatureCollection'),
  features: z.array(
    z.object({
      type: z.literal('Feature'),
      id: z.string(),
      geometry: z
        .union([
          z.object({ type: z.literal('Point'), coordinates: PositionSchema }),
          z.object({ type: z.literal('LineString'), coordinates: z.array(PositionSchema) }),
        ])
        .nullable(),
      /** `featureKind` ('run' | 'item'), label, depths, `revisionId`/`revision`, and plan coordinates (`planRoute` [[x, y], …] for runs, `planX`/`planY` for items). */
      properties: z.record(z.string(), z.unknown()),
    }),
  ),
});

/**
 * The cumulative buried-cable map of a site: every run and item of the latest ready revision of every
 * job at the site, each tagged with the revision it came from. `geojson` is null when the site has no
 * GPS origin (plan coordinates only).
 */
export const SiteMapSchema = z.object({
  frame: z.object({ northAzimuthDeg: z.number(), origin: z.object({ lat: z.number(), lon: z.number() }).nullable() }),
  revisions: z.array(z.object({ ...FromRevisionShape, issuedAt: z.string() })),
  referencePoints: z.array(SiteMapReferencePointSchema),
  /** Landmarks (house, fences, patio …) of the newest revision, drawn in grey under the runs. */
  siteFeatures: z.array(SiteMapFeatureSchema),
  items: z.array(SiteMapItemSchema),
  runs: z.array(SiteMapRunSchema),
  geojson: SiteMapGeoJsonSchema.nullable(),
});

export type SiteMapItem = z.infer<typeof SiteMapItemSchema>;
export type SiteMapRun = z.infer<typeof SiteMapRunSchema>;
export type SiteMap = z.infer<typeof SiteMapSchema>;
export type SiteMapGeoJson = z.infer<typeof SiteMapGeoJsonSchema>;
