import type { PlanPoint } from '@domain/as-built/common.schema';
import type { PlanCalibration } from '@domain/sites/site.schema';

/** A point on the site-plan image, pixels (x right, y down). */
export type ImagePoint = { x: number; y: number };

/**
 * Where the plan image lies in plan metres. The same convention as the server's site-plan drawing
 * (api/src/drawings/site-plan-layout.ts, `PlanImage`): the image is drawn with plan +y up, scaled so
 * that the pixel distance between calibration points A and B is `distanceM`, and A lies at `planA`
 * (the plan origin unless told otherwise).
 */
export type ImagePlacement = { imageA: ImagePoint; planA: PlanPoint; metresPerPixel: number };

/**
 * Width an uncalibrated image is shown at, metres: a residential lot is a few tens of metres across,
 * so the image starts at about the size the plan will have once it is calibrated.
 */
export const UNCALIBRATED_IMAGE_WIDTH_M = 40;

/** The placement a calibration gives (A at `planA`, default the plan origin). */
export function placementOf(calibration: PlanCalibration, planA: PlanPoint = { x: 0, y: 0 }): ImagePlacement {
  const px = Math.hypot(calibration.b.x - calibration.a.x, calibration.b.y - calibration.a.y);
  if (!(px > 0) || !(calibration.distanceM > 0)) throw new Error('a calibration needs two distinct points and a positive distance');
  return { imageA: calibration.a, planA, metresPerPixel: calibration.distanceM / px };
}

/**
 * The placement of an image that has no calibration yet: its top-left corner at the plan origin and
 * {@link UNCALIBRATED_IMAGE_WIDTH_M} wide, only so that points can be picked on it.
 */
export function provisionalPlacement(widthPx: number): ImagePlacement {
  return { imageA: { x: 0, y: 0 }, planA: { x: 0, y: 0 }, metresPerPixel: UNCALIBRATED_IMAGE_WIDTH_M / Math.max(widthPx, 1) };
}

/** Image pixel → plan metres (image y grows down, plan y grows up). */
export function imageToPlan(p: ImagePoint, placement: ImagePlacement): PlanPoint {
  const { imageA, planA, metresPerPixel: k } = placement;
  return { x: planA.x + (p.x - imageA.x) * k, y: planA.y - (p.y - imageA.y) * k };
}

/** Plan metres → image pixel; the inverse of {@link imageToPlan}. */
export function planToImage(p: PlanPoint, placement: ImagePlacement): ImagePoint {
  const { imageA, planA, metresPerPixel: k } = placement;
  return { x: imageA.x + (p.x - planA.x) / k, y: imageA.y - (p.y - planA.y) / k };
}

/** The image's rectangle in plan metres: its top-left corner and its size. */
export function imagePlanBox(widthPx: number, heightPx: number, placement: ImagePlacement): { topLeft: PlanPoint; widthM: number; heightM: number } {
  return {
    topLeft: imageToPlan({ x: 0, y: 0 }, placement),
    widthM: widthPx * placement.metresPerPixel,
    heightM: heightPx * placement.metresPerPixel,
  };
}

/** The nearest of `candidates` within `toleranceM` of `p`, or undefined. */
export function snapPoint<T extends PlanPoint>(p: PlanPoint, candidates: readonly T[], toleranceM: number): T | undefined {
  let best: T | undefined;
  let bestDistance = toleranceM;
  for (const candidate of candidates) {
    const d = Math.hypot(candidate.x - p.x, candidate.y - p.y);
    if (d <= bestDistance) {
      best = candidate;
      bestDistance = d;
    }
  }
  return best;
}

/** The segment of `route` nearest to `p`: its index (segment i joins points i and i+1), distance and the foot of the perpendicular. */
export function nearestSegment(route: readonly PlanPoint[], p: PlanPoint): { index: number; distanceM: number; foot: PlanPoint } | undefined {
  let best: { index: number; distanceM: number; foot: PlanPoint } | undefined;
  for (let i = 0; i + 1 < route.length; i += 1) {
    const a = route[i]!;
    const b = route[i + 1]!;
    const dx = b.x - a.x;
    const dy = b.y - a.y;
    const length2 = dx * dx + dy * dy;
    const t = length2 === 0 ? 0 : Math.max(0, Math.min(1, ((p.x - a.x) * dx + (p.y - a.y) * dy) / length2));
    const foot = { x: a.x + t * dx, y: a.y + t * dy };
    const distanceM = Math.hypot(p.x - foot.x, p.y - foot.y);
    if (best === undefined || distanceM < best.distanceM) best = { index: i, distanceM, foot };
  }
  return best;
}

/** `route` with `p` inserted into segment `segmentIndex` (between points i and i+1). */
export function insertRoutePoint(route: readonly PlanPoint[], segmentIndex: number, p: PlanPoint): PlanPoint[] {
  if (segmentIndex < 0 || segmentIndex + 1 >= route.length) throw new RangeError(`no segment ${segmentIndex} in a route of ${route.length} points`);
  return [...route.slice(0, segmentIndex + 1), p, ...route.slice(segmentIndex + 1)];
}

/** `route` with point `index` moved to `p`. */
export function moveRoutePoint(route: readonly PlanPoint[], index: number, p: PlanPoint): PlanPoint[] {
  if (index < 0 || index >= route.length) throw new RangeError(`no point ${index} in a route of ${route.length} points`);
  return route.map((q, i) => (i === index ? p : q));
}

/** `route` without point `index`. */
export function removeRoutePoint(route: readonly PlanPoint[], index: number): PlanPoint[] {
  if (index < 0 || index >= route.length) throw new RangeError(`no point ${index} in a route of ${route.length} points`);
  return route.filter((_q, i) => i !== index);
}

/**
 * Plan coordinates as stored: rounded to the millimetre, since a tap on a phone is good to a few
 * centimetres at best and long decimals only make the record harder to read.
 */
export function roundPlanPoint(p: PlanPoint): PlanPoint {
  return { x: Math.round(p.x * 1000) / 1000, y: Math.round(p.y * 1000) / 1000 };
}

/** An angle in degrees brought into [0, 360). */
export function normalizeDegrees(deg: number): number {
  const r = deg % 360;
  return r < 0 ? r + 360 : r === 0 ? 0 : r;
}

// The scale bar is shared with the locate map (a page without the plan's code): lib/scale-bar.ts.
export { scaleBarFor } from '../../../lib/scale-bar';
