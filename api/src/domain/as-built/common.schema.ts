import { z } from 'zod';

/**
 * Upper bounds that keep a hostile or accidental payload from exhausting the server. They are far above
 * what a residential job records (a large estate has a few hundred items).
 */
export const AS_BUILT_LIMITS = {
  maxItems: 5000,
  maxRuns: 5000,
  maxReferencePoints: 500,
  maxZones: 200,
  maxChecks: 2000,
  maxChannelsPerAmplifier: 32,
  maxPairsPerRun: 16,
  maxConductors: 32,
  maxTiesPerItem: 12,
  maxRoutePoints: 2000,
  maxDepthReadings: 1000,
  maxIdLength: 64,
  maxLabelLength: 120,
  maxTextLength: 2000,
  /** Plan coordinates and lengths are bounded to 100 km: a site plan is never larger. */
  maxPlanExtentM: 100_000,
  maxLengthM: 100_000,
  /** 100 kΩ: above any speaker, tap or line impedance that makes sense. */
  maxImpedanceOhm: 100_000,
  maxWatts: 100_000,
} as const;

/** An identifier: any non-empty string up to 64 characters (UUIDs from the database fit). */
export const IdSchema = z.string().trim().min(1).max(AS_BUILT_LIMITS.maxIdLength);

export const LabelSchema = z.string().trim().min(1).max(AS_BUILT_LIMITS.maxLabelLength);

export const OptionalTextSchema = z.string().max(AS_BUILT_LIMITS.maxTextLength).optional();

export const OptionalShortTextSchema = z.string().max(AS_BUILT_LIMITS.maxLabelLength).optional();

/** A finite number (rejects NaN and ±Infinity, which JSON cannot carry but JS callers can). */
export const FiniteSchema = z.number().finite();

/** A plan coordinate in metres (x east, y north on the plan). */
export const PlanCoordinateSchema = FiniteSchema.min(-AS_BUILT_LIMITS.maxPlanExtentM).max(
  AS_BUILT_LIMITS.maxPlanExtentM,
);

export const PlanPointSchema = z.object({ x: PlanCoordinateSchema, y: PlanCoordinateSchema });
export type PlanPoint = z.infer<typeof PlanPointSchema>;

/** How a position was found: solved from taped ties, placed on the plan by hand, or a phone's GPS fix. */
export const PositionSourceSchema = z.enum(['ties', 'manual', 'gps']);
export type PositionSource = z.infer<typeof PositionSourceSchema>;

/** The estimated horizontal error of a position, metres (10 km: beyond any fix worth keeping). */
export const PositionAccuracyMSchema = FiniteSchema.nonnegative().max(10_000);

/** A length in metres, zero or more. */
export const LengthMSchema = FiniteSchema.nonnegative().max(AS_BUILT_LIMITS.maxLengthM);

/** A strictly positive length in metres. */
export const PositiveLengthMSchema = FiniteSchema.positive().max(AS_BUILT_LIMITS.maxLengthM);

export const ImpedanceOhmSchema = FiniteSchema.positive().max(AS_BUILT_LIMITS.maxImpedanceOhm);

export const WattsSchema = FiniteSchema.positive().max(AS_BUILT_LIMITS.maxWatts);

/** Whether `YYYY-MM-DD` names a day that exists (no 2026-02-30, no month 13, no year 0). */
function isCalendarDate(text: string): boolean {
  const [year, month, day] = text.split('-').map(Number) as [number, number, number];
  // setUTCFullYear, unlike Date.UTC, does not read years 0–99 as 1900–1999.
  const date = new Date(0);
  date.setUTCFullYear(year, month - 1, day);
  return year >= 1 && date.getUTCFullYear() === year && date.getUTCMonth() === month - 1 && date.getUTCDate() === day;
}

/** ISO calendar date, e.g. 2026-05-14; it must exist (a date column refuses 2026-02-30 with an error). */
export const IsoDateSchema = z
  .string()
  .regex(/^\d{4}-\d{2}-\d{2}$/, 'expected a date as YYYY-MM-DD')
  .refine(isCalendarDate, 'no such date: check the month and the day');

/**
 * Constant-voltage line nominal. '70V' is the North-American 70.7 V rms line (100 V peak / √2);
 * '100V' the European line; '25V' the Class 2 line.
 */
export const CvLineVoltageSchema = z.enum(['25V', '70V', '100V']);
export type CvLineVoltage = z.infer<typeof CvLineVoltageSchema>;

/** Reference to one output channel of one amplifier item. */
export const ChannelRefSchema = z.object({ amplifierItemId: IdSchema, channelId: IdSchema });
export type ChannelRef = z.infer<typeof ChannelRefSchema>;
