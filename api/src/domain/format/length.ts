import { METRES_PER_FOOT, METRES_PER_INCH } from '../as-built/units.js';
import { nominalCoverInches } from '../depth/depth-rules.js';

/**
 * One place that writes lengths for people: forms, screens, and print. Everything is stored in metres;
 * these functions only choose how a value reads.
 *
 * - `long`: lengths along the ground (run lengths, stations, ties): `26 ft 3 in` or `8.01 m`;
 * - `short`: depths and hole sizes: `4 1/8 in` (nearest eighth of an inch) or `11.5 cm`.
 */
export type LengthSystem = 'imperial' | 'metric';
export type LengthScale = 'long' | 'short';

/** A number with at most `digits` decimals, trailing zeros trimmed, never "-0". */
export function trimNumber(value: number, digits: number): string {
  const fixed = Number(value.toFixed(digits));
  return String(Object.is(fixed, -0) ? 0 : fixed);
}

/** Reduces n/8 to lowest terms: 4/8 → `1/2`, 6/8 → `3/4`, 1/8 → `1/8`. */
function eighths(n: number): string {
  let num = n;
  let den = 8;
  while (num % 2 === 0 && den > 1) {
    num /= 2;
    den /= 2;
  }
  return `${num}/${den}`;
}

/**
 * Inches to the nearest 1/8 in, written as a mixed number without the unit: `4 1/8`, `7 3/4`, `1/2`, `6`.
 * Negative input keeps its sign in front.
 */
export function formatInchesEighths(inches: number): string {
  const sign = inches < 0 ? '-' : '';
  const total = Math.round(Math.abs(inches) * 8);
  const whole = Math.floor(total / 8);
  const rest = total - whole * 8;
  if (total === 0) return '0';
  if (rest === 0) return `${sign}${whole}`;
  return whole === 0 ? `${sign}${eighths(rest)}` : `${sign}${whole} ${eighths(rest)}`;
}

/**
 * Whole feet and inches to the nearest `stepInches`, carrying 12 in into the next foot (so 11.97 in
 * never reads as `0 ft 12 in`). Works on the absolute value; the caller adds a sign.
 */
function feetAndInches(m: number, stepInches: number): { feet: number; inches: number } {
  const totalSteps = Math.round(Math.abs(m) / METRES_PER_INCH / stepInches);
  const totalInches = totalSteps * stepInches;
  const feet = Math.floor((totalInches + 1e-9) / 12);
  return { feet, inches: Math.max(0, totalInches - feet * 12) };
}

/** A length along the ground: `26 ft 3 in`, `40 ft`, `0 ft 8 in` (nearest inch); metric `8.01 m`. */
export function formatGroundLength(m: number, system: LengthSystem): string {
  if (system === 'metric') return `${trimNumber(m, 2)} m`;
  const { feet, inches } = feetAndInches(m, 1);
  const sign = m < 0 && (feet > 0 || inches > 0) ? '-' : '';
  return inches === 0 ? `${sign}${feet} ft` : `${sign}${feet} ft ${inches} in`;
}

/** A depth or hole size: `4 1/8 in`, `18 in` (nearest eighth of an inch); metric `11.5 cm`. */
export function formatDepthLength(m: number, system: LengthSystem): string {
  if (system === 'metric') return `${trimNumber(m * 100, 1)} cm`;
  return `${formatInchesEighths(m / METRES_PER_INCH)} in`;
}

/**
 * A safety distance either side of a cable (the locate tolerance zone): imperial as a depth (`18 in`),
 * metric in metres rounded up to the next 0.1 m (`0.5 m`), so the rounded figure is never the narrower one.
 */
export function formatToleranceZone(m: number, system: LengthSystem): string {
  if (system === 'metric') return `${trimNumber(Math.ceil(m * 10 - 1e-9) / 10, 1)} m`;
  return formatDepthLength(m, system);
}

/** Either of the above by scale. */
export function formatLength(m: number, system: LengthSystem, scale: LengthScale): string {
  return scale === 'long' ? formatGroundLength(m, system) : formatDepthLength(m, system);
}

/**
 * The text put back into a field for editing, which the length parser reads back to the same value
 * within its rounding: imperial ground lengths as `18' 6"` (inches to 1/8 in, so a tape reading
 * survives a round trip within 3 mm), depths as `7 3/4` (the field's unit is inches); metric as a plain
 * number of metres (3 decimals) or centimetres (1 decimal).
 */
export function lengthEditText(m: number, system: LengthSystem, scale: LengthScale): string {
  if (system === 'metric') return scale === 'long' ? trimNumber(m, 3) : trimNumber(m * 100, 1);
  if (scale === 'short') return formatInchesEighths(m / METRES_PER_INCH);
  const { feet, inches } = feetAndInches(m, 1 / 8);
  const sign = m < 0 ? '-' : '';
  return inches === 0 ? `${sign}${feet}'` : `${sign}${feet}' ${formatInchesEighths(inches)}"`;
}

/** The unit a bare number is read and shown in, for each system and scale. */
export function unitSymbol(system: LengthSystem, scale: LengthScale): string {
  if (system === 'metric') return scale === 'long' ? 'm' : 'cm';
  return scale === 'long' ? 'ft' : 'in';
}

/** Metres per unit of {@link unitSymbol}. */
export function unitFactor(system: LengthSystem, scale: LengthScale): number {
  if (system === 'metric') return scale === 'long' ? 1 : 0.01;
  return scale === 'long' ? METRES_PER_FOOT : METRES_PER_INCH;
}

/**
 * A required cover (a depth rule's minimum): the inches the rule was written in when its metres are one of
 * the NEC's own metric equivalents (150 mm is the code's 6 in, not 5 7/8 in), otherwise as any depth
 * ({@link formatDepthLength}, nearest 1/8 in); metric `15 cm`. A measured depth is never snapped: a
 * reading of 15 cm on a metric tape prints `5 7/8 in`.
 */
export function formatRuleDepth(m: number, system: LengthSystem): string {
  if (system === 'imperial') {
    const nominal = nominalCoverInches(m);
    if (nominal !== undefined) return `${nominal} in`;
  }
  return formatDepthLength(m, system);
}

/**
 * What a number stands for, so that it can be written at the edge in the reader's units: a length along
 * the ground, a depth (measured cover, hole size, shortfall) or a rule's required cover.
 */
export type QuantityKind = 'length' | 'depth' | 'rule_depth';

/** A quantity in SI (metres), unrounded. */
export interface Quantity {
  kind: QuantityKind;
  m: number;
}

/** A quantity in the reader's units: `26 ft 3 in`, `4 3/8 in`, `6 in`; metric `8.01 m`, `11 cm`, `15 cm`. */
export function formatQuantity(q: Quantity, system: LengthSystem): string {
  if (!Number.isFinite(q.m)) return q.m > 0 ? 'an unknown distance' : String(q.m);
  return q.kind === 'length' ? formatGroundLength(q.m, system) : q.kind === 'depth' ? formatDepthLength(q.m, system) : formatRuleDepth(q.m, system);
}
