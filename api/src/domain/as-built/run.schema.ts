import { z } from 'zod';

import { isKnownMm2, MAX_AWG, MIN_AWG } from '../cable/wire.js';
import {
  AS_BUILT_LIMITS,
  ChannelRefSchema,
  FiniteSchema,
  IdSchema,
  LabelSchema,
  LengthMSchema,
  OptionalTextSchema,
  PlanPointSchema,
  PositionAccuracyMSchema,
  PositionSourceSchema,
  PositiveLengthMSchema,
} from './common.schema.js';

/**
 * Conductor size. AWG is an integer gauge, with 0 = 1/0, −1 = 2/0, −2 = 3/0, −3 = 4/0 (ASTM B258
 * numbering). Metric sizes must be one of the IEC 60228 nominal areas we hold a resistance for.
 */
export const GaugeSchema = z.discriminatedUnion('system', [
  z.object({
    system: z.literal('awg'),
    awg: z
      .number()
      .int('AWG gauge must be a whole number (use 0 for 1/0, -1 for 2/0 …)')
      .min(MIN_AWG)
      .max(MAX_AWG),
  }),
  z.object({
    system: z.literal('mm2'),
    mm2: FiniteSchema.refine(isKnownMm2, {
      message: 'unknown metric conductor size: use an IEC 60228 size (0.5, 0.75, 1, 1.5, 2.5, 4, 6 or 10 mm²)',
    }),
  }),
]);
export type Gauge = z.infer<typeof GaugeSchema>;

export const InstallMethodSchema = z.enum(['direct_burial', 'conduit', 'under_hardscape_sleeve', 'indoor']);
export type InstallMethod = z.infer<typeof InstallMethodSchema>;

/**
 * Where a buried run lies, for the depth rule table. 'general' = lawn, beds and any place not listed.
 * 'under_hardscape' = under a patio/walk slab without vehicle traffic; 'under_driveway' = a one- or
 * two-family dwelling's driveway; 'under_street' = public roads, alleys, parking lots;
 * 'trench_below_concrete' = in a trench below ≥ 2 in of concrete; 'under_building'.
 */
export const BurialLocationSchema = z.enum([
  'general',
  'under_hardscape',
  'under_driveway',
  'under_street',
  'trench_below_concrete',
  'under_building',
]);
export type BurialLocation = z.infer<typeof BurialLocationSchema>;

/**
 * One pair of conductors in a run and the amplifier channel it carries (`channel: null` = spare pair).
 * Pair 1 is conductors 1–2, pair 2 conductors 3–4, … A 4-conductor run can carry two channels, or one
 * channel on both pairs (the pairs are then in parallel and the loop resistance halves).
 */
export const RunPairSchema = z.object({
  pairIndex: z.number().int().min(1).max(AS_BUILT_LIMITS.maxPairsPerRun),
  channel: ChannelRefSchema.nullable(),
});
export type RunPair = z.infer<typeof RunPairSchema>;

/**
 * A bend of a run's route on the plan. `source` says how it was placed, as for an item's position:
 * 'gps' = the phone's fix converted to plan metres (then `accuracyM`, the fix's estimated horizontal
 * error, is required: a phone fix is several times weaker than taped ties and must say by how much),
 * 'manual' = placed on the plan, 'ties' = solved from taped ties. Absent = not stated: bends drawn on the
 * plan, and every bend stored before sources were kept (they count as drawn by hand).
 */
export const RoutePointSchema = PlanPointSchema.extend({
  source: PositionSourceSchema.optional(),
  accuracyM: PositionAccuracyMSchema.optional(),
}).refine((point) => point.source !== 'gps' || point.accuracyM !== undefined, {
  path: ['accuracyM'],
  message: 'a bend placed by GPS needs its accuracy in metres (accuracyM)',
});
export type RoutePoint = z.infer<typeof RoutePointSchema>;

/** A depth reading: cover (top of cable to finished grade), metres, at a station measured from the run's from-end. */
export const DepthReadingSchema = z.object({
  stationM: LengthMSchema,
  depthM: FiniteSchema.nonnegative().max(10),
});
export type DepthReading = z.infer<typeof DepthReadingSchema>;

/**
 * One cable between two items. Record runs from the amplifier side outward (`fromItemId` is nearer the
 * amplifier); the analysis tolerates either direction but the schema rejects a directed cycle.
 */
export const RunSchema = z.object({
  id: IdSchema,
  label: LabelSchema,
  fromItemId: IdSchema,
  toItemId: IdSchema,
  /** Free text the crew knows the cable by, e.g. "14/4 direct burial"; cable totals group by it. */
  cableType: LabelSchema,
  gauge: GaugeSchema,
  conductors: z.number().int().min(2).max(AS_BUILT_LIMITS.maxConductors),
  pairs: z.array(RunPairSchema).max(AS_BUILT_LIMITS.maxPairsPerRun),
  /** Tape or reel-mark length of the cable, one way, metres. */
  measuredLengthM: PositiveLengthMSchema,
  method: InstallMethodSchema,
  location: BurialLocationSchema.optional(),
  route: z.array(RoutePointSchema).min(2).max(AS_BUILT_LIMITS.maxRoutePoints).optional(),
  depthReadings: z.array(DepthReadingSchema).max(AS_BUILT_LIMITS.maxDepthReadings).optional(),
  isSpare: z.boolean().optional(),
  isAbandoned: z.boolean().optional(),
  notes: OptionalTextSchema,
});
export type Run = z.infer<typeof RunSchema>;
