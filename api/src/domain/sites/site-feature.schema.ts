import { z } from 'zod';

import { LabelSchema, PlanPointSchema } from '../as-built/common.schema.js';

/**
 * Site features: the landmarks a stranger orients by ("the east fence", "the patio") — the house
 * footprint, fences, walls, patios and paths, pools and spas, driveways, trees and beds. They belong to
 * the site, not to a job (they outlive jobs), are drawn in muted grey under the runs, and are placed in
 * plan coordinates (metres, x to the plan's right, y to its top) like reference points.
 */
export const SITE_FEATURE_KINDS = ['house', 'outbuilding', 'fence', 'wall', 'patio', 'path', 'pool', 'spa', 'driveway', 'tree', 'bed', 'other'] as const;
export const SiteFeatureKindSchema = z.enum(SITE_FEATURE_KINDS);
export type SiteFeatureKind = z.infer<typeof SiteFeatureKindSchema>;

export const SITE_FEATURE_KIND_LABELS: Record<SiteFeatureKind, string> = {
  house: 'House',
  outbuilding: 'Outbuilding',
  fence: 'Fence',
  wall: 'Wall',
  patio: 'Patio',
  path: 'Path',
  pool: 'Pool',
  spa: 'Spa',
  driveway: 'Driveway',
  tree: 'Tree or shrub',
  bed: 'Planting bed',
  other: 'Other',
};

/** An outline (closed, at least 3 points) or a line (open, at least 2 points). */
export const SiteFeatureShapeSchema = z.enum(['polygon', 'line']);
export type SiteFeatureShape = z.infer<typeof SiteFeatureShapeSchema>;

/** The shape a kind is usually drawn as (the editor's default). */
export const DEFAULT_FEATURE_SHAPE: Record<SiteFeatureKind, SiteFeatureShape> = {
  house: 'polygon',
  outbuilding: 'polygon',
  fence: 'line',
  wall: 'line',
  patio: 'polygon',
  path: 'line',
  pool: 'polygon',
  spa: 'polygon',
  driveway: 'polygon',
  tree: 'polygon',
  bed: 'polygon',
  other: 'polygon',
};

export const SITE_FEATURE_LIMITS = { maxPoints: 500, maxFeaturesPerSite: 300 } as const;

const PointsSchema = z.array(PlanPointSchema).min(2, { error: 'at least 2 points' }).max(SITE_FEATURE_LIMITS.maxPoints);

/** Problems with a shape's points: too few for the shape, or two consecutive points the same. */
export function featurePointsIssue(shape: SiteFeatureShape, points: readonly { x: number; y: number }[]): string | null {
  if (shape === 'polygon' && points.length < 3) return 'an outline needs at least 3 points';
  if (points.length < 2) return 'a line needs at least 2 points';
  for (let i = 1; i < points.length; i += 1) {
    if (points[i]!.x === points[i - 1]!.x && points[i]!.y === points[i - 1]!.y) return `point ${i} repeats the point before it`;
  }
  return null;
}

export const CreateSiteFeatureSchema = z
  .object({
    kind: SiteFeatureKindSchema,
    name: LabelSchema,
    shape: SiteFeatureShapeSchema,
    points: PointsSchema,
  })
  .superRefine((v, ctx) => {
    const issue = featurePointsIssue(v.shape, v.points);
    if (issue !== null) ctx.addIssue({ code: 'custom', path: ['points'], message: issue });
  });
export type CreateSiteFeatureInput = z.infer<typeof CreateSiteFeatureSchema>;

/** A partial change; points and shape are checked together against the stored feature by the service. */
export const UpdateSiteFeatureSchema = z
  .object({
    kind: SiteFeatureKindSchema,
    name: LabelSchema,
    shape: SiteFeatureShapeSchema,
    points: PointsSchema,
  })
  .partial()
  .refine((v) => Object.keys(v).length > 0, { error: 'nothing to change' });
export type UpdateSiteFeatureInput = z.infer<typeof UpdateSiteFeatureSchema>;

export const SiteFeatureResponseSchema = z.object({
  id: z.string(),
  kind: SiteFeatureKindSchema,
  name: z.string(),
  shape: SiteFeatureShapeSchema,
  points: z.array(z.object({ x: z.number(), y: z.number() })),
  createdAt: z.string(),
  updatedAt: z.string(),
});
export type SiteFeatureResponse = z.infer<typeof SiteFeatureResponseSchema>;
