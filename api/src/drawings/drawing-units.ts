import { metresToFeet, metresToInches } from '../domain/as-built/units.js';
import { formatCoverDepth, formatGroundLength } from '../domain/format/length.js';

/** Units for the labels on a drawing. Geometry is always computed in SI. */
export type UnitSystem = 'metric' | 'imperial';

/** Formats a number with at most `maxDecimals` decimals, trailing zeros trimmed, never "-0". */
export function formatNumber(value: number, maxDecimals: number): string {
  const fixed = Number(value.toFixed(maxDecimals));
  return String(Object.is(fixed, -0) ? 0 : fixed);
}

/**
 * A plan length (tie, run length, station) as everywhere else (domain/format/length): `8.01 m`, or
 * feet and inches to the nearest inch, `26 ft 3 in`.
 */
export function formatLength(m: number, units: UnitSystem): string {
  return formatGroundLength(m, units);
}

/**
 * A burial depth (cover) as in the packet (domain/format/length formatCoverDepth): `11 cm`, or inches
 * to the nearest 1/4 in, `4 1/4 in` (0.15 m reads `6 in`, the usual 6-inch rule).
 */
export function formatDepth(m: number, units: UnitSystem): string {
  return formatCoverDepth(m, units);
}

/** Value of a length in the unit an axis or scale bar counts in: metres or feet. */
export function toAxisLengthUnit(m: number, units: UnitSystem): number {
  return units === 'metric' ? m : metresToFeet(m);
}

/** Value of a depth in the unit a depth axis counts in: centimetres or inches. */
export function toAxisDepthUnit(m: number, units: UnitSystem): number {
  return units === 'metric' ? m * 100 : metresToInches(m);
}

export function lengthUnitSymbol(units: UnitSystem): string {
  return units === 'metric' ? 'm' : 'ft';
}

export function depthUnitSymbol(units: UnitSystem): string {
  return units === 'metric' ? 'cm' : 'in';
}

/**
 * A "nice" step (1, 2, 2.5 or 5 × 10ⁿ) so that `span / step` is close to `targetCount` ticks. Used for
 * axes and scale bars.
 */
export function niceStep(span: number, targetCount: number): number {
  if (!(span > 0) || !(targetCount > 0)) return 1;
  const raw = span / targetCount;
  const power = 10 ** Math.floor(Math.log10(raw));
  const fraction = raw / power;
  const nice = fraction <= 1 ? 1 : fraction <= 2 ? 2 : fraction <= 2.5 ? 2.5 : fraction <= 5 ? 5 : 10;
  return nice * power;
}
