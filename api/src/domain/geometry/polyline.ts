import type { PlanPoint } from '../as-built/common.schema.js';

/** Length of a plan polyline, metres (sum of straight segments); 0 for fewer than two points. Unrounded. */
export function polylineLengthM(points: readonly PlanPoint[]): number {
  let length = 0;
  for (let i = 1; i < points.length; i += 1) {
    const a = points[i - 1]!;
    const b = points[i]!;
    length += Math.hypot(b.x - a.x, b.y - a.y);
  }
  return length;
}

export interface LengthTolerance {
  /** Absolute allowance, metres (default 1 m). */
  absoluteM: number;
  /** Relative allowance as a fraction of the measured length (default 0.10). */
  relative: number;
}

export const DEFAULT_LENGTH_TOLERANCE: LengthTolerance = { absoluteM: 1, relative: 0.1 };

export interface LengthComparison {
  routeLengthM: number;
  measuredLengthM: number;
  /** measured − route, metres: positive when more cable went in than the drawn route. */
  differenceM: number;
  allowedM: number;
  isMismatch: boolean;
}

/**
 * Compares a drawn route's plan length with the measured cable length. The allowance is the larger of
 * `absoluteM` and `relative`·measured (default max(1 m, 10 %)), because a measured length normally
 * exceeds the plan route: the cable rises out of the trench at both ends and leaves service loops.
 * A difference beyond the allowance, either way, is a mismatch (a mis-drawn route or a wrong length).
 */
export function compareRouteLength(
  routeLengthM: number,
  measuredLengthM: number,
  tolerance: LengthTolerance = DEFAULT_LENGTH_TOLERANCE,
): LengthComparison {
  const differenceM = measuredLengthM - routeLengthM;
  const allowedM = Math.max(tolerance.absoluteM, tolerance.relative * measuredLengthM);
  return { routeLengthM, measuredLengthM, differenceM, allowedM, isMismatch: Math.abs(differenceM) > allowedM };
}
