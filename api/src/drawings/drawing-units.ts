import { metresToFeet, metresToInches } from '../domain/as-built/units.js';

/**
 * Axis and scale-bar units of the drawings. Every length, depth and number a drawing writes goes through
 * the one formatter, domain/format/length (`formatGroundLength`, `formatDepthLength`, `formatRuleDepth`,
 * `trimNumber`); this file only converts values for axes.
 */

/** Units for the labels on a drawing. Geometry is always computed in SI. */
export type UnitSystem = 'metric' | 'imperial';

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
