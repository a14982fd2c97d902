import { z } from 'zod';

/** Site-plan layers that can be turned off, by the names the API (`?layers=`) and the web app use. */
export const SITE_PLAN_LAYER_NAMES = ['reference-points', 'labels', 'depths', 'spare-and-abandoned'] as const;
export type SitePlanLayerName = (typeof SITE_PLAN_LAYER_NAMES)[number];

const UnitsSchema = z.enum(['metric', 'imperial'], { error: 'must be metric or imperial' });

/** `GET /api/jobs/:id/drawings/schematic.svg` and `…/runs/:runId/depth-profile.svg`. */
export const DrawingQuerySchema = z.object({ units: UnitsSchema.optional() });
export type DrawingQuery = z.infer<typeof DrawingQuerySchema>;

/** `GET /api/jobs/:id/drawings/site-plan.svg`: `layers` lists the layers to turn OFF, comma-separated. */
export const SitePlanDrawingQuerySchema = DrawingQuerySchema.extend({
  paper: z.enum(['a4', 'letter'], { error: 'must be a4 or letter' }).optional(),
  layers: z
    .string()
    .max(200)
    .optional()
    .transform((value, ctx) => {
      const names = (value ?? '')
        .split(',')
        .map((name) => name.trim())
        .filter((name) => name !== '');
      const unknown = names.filter((name) => !(SITE_PLAN_LAYER_NAMES as readonly string[]).includes(name));
      if (unknown.length > 0) {
        ctx.addIssue({ code: 'custom', message: `unknown layer ${unknown.map((n) => `"${n}"`).join(', ')}; use ${SITE_PLAN_LAYER_NAMES.join(', ')}` });
        return z.NEVER;
      }
      return [...new Set(names)] as SitePlanLayerName[];
    }),
});
export type SitePlanDrawingQuery = z.infer<typeof SitePlanDrawingQuerySchema>;
