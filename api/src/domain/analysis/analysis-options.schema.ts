import { z } from 'zod';

import { CONDUCTOR_TEMPERATURE_RANGE_C } from '../cable/wire.js';
import { DEFAULT_CHECK_TOLERANCES } from '../checks/commissioning-compare.js';
import { DepthRuleTableSchema } from '../depth/depth-rules.schema.js';
import { DEFAULT_DEPTH_RULES } from '../depth/depth-rules.js';
import { DEFAULT_LENGTH_TOLERANCE } from '../geometry/polyline.js';
import { CV_DEFAULT_MAX_LOAD_FRACTION } from '../loads/constant-voltage.js';

const fraction = z.number().finite().min(0).max(10);

/**
 * Options of a full analysis; every field has a default, so `{}` is valid. All values SI.
 */
export const AnalysisOptionsSchema = z.object({
  /** Conductor temperature for cable resistance, °C (default 20 °C; buried cable in summer ~25–30 °C). */
  conductorTemperatureC: z
    .number()
    .finite()
    .min(CONDUCTOR_TEMPERATURE_RANGE_C.min)
    .max(CONDUCTOR_TEMPERATURE_RANGE_C.max)
    .default(20),
  /** Largest acceptable cable loss at a speaker, dB (default 0.5 dB, common practice). */
  lossLimitDb: z.number().finite().positive().max(20).default(0.5),
  /** A channel load below this is a short, ohms (default 0.5 Ω). */
  shortThresholdOhm: z.number().finite().positive().max(100).default(0.5),
  /** CV taps may use at most this fraction of the amp's rating (default 0.8, common practice). */
  cvMaxLoadFraction: z.number().finite().positive().max(1).default(CV_DEFAULT_MAX_LOAD_FRACTION),
  /** Standard error of one taped tie, metres (default 0.05 m). */
  tapeToleranceM: z.number().finite().positive().max(10).default(0.05),
  routeLengthTolerance: z
    .object({ absoluteM: z.number().finite().nonnegative().max(1000), relative: fraction })
    .default({ ...DEFAULT_LENGTH_TOLERANCE }),
  depthRules: DepthRuleTableSchema.default(DEFAULT_DEPTH_RULES),
  checkTolerances: z
    .object({
      dcrFractionOfNominal: z.object({ low: fraction, high: fraction }),
      dcReadingAllowance: z.object({ ohm: z.number().finite().nonnegative().max(100), fraction }),
      impedanceBand: z.object({ low: fraction, high: fraction }),
      shortOhm: z.number().finite().nonnegative().max(100),
      openFactor: z.number().finite().min(1).max(1000),
    })
    .default(DEFAULT_CHECK_TOLERANCES),
  /** Build the GeoJSON FeatureCollection (needs the site origin). Default true. */
  includeGeoJson: z.boolean().default(true),
});
export type AnalysisOptions = z.infer<typeof AnalysisOptionsSchema>;
export type AnalysisOptionsInput = z.input<typeof AnalysisOptionsSchema>;
