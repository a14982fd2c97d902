import type { PlanPoint } from '../as-built/common.schema.js';

export type CircleIntersection =
  | {
      status: 'two_points';
      /** Solution to the right of the directed line P0 → P1 (plan y up). */
      right: PlanPoint;
      /** Solution to the left of the directed line P0 → P1. */
      left: PlanPoint;
      /** Angle between the two ties at the solution, degrees (90° = strongest fix). */
      angleDeg: number;
    }
  | { status: 'tangent'; point: PlanPoint }
  | { status: 'separate' }
  | { status: 'contained' }
  | { status: 'concentric' };

/**
 * Intersection of two circles (centre P0 radius r0, centre P1 radius r1), plan metres, after
 * P. Bourke, "Intersection of two circles" (1997): d = |P1 − P0|, a = (r0² − r1² + d²)/(2d),
 * h = √(r0² − a²). `toleranceM` lets circles that miss (or overlap inside) by up to that much — tape
 * error — meet at the tangent point instead of failing. Unrounded.
 */
export function intersectCircles(p0: PlanPoint, r0: number, p1: PlanPoint, r1: number, toleranceM = 0): CircleIntersection {
  const dx = p1.x - p0.x;
  const dy = p1.y - p0.y;
  const d = Math.hypot(dx, dy);
  if (d === 0) return { status: 'concentric' };
  if (d > r0 + r1 + toleranceM) return { status: 'separate' };
  if (d < Math.abs(r0 - r1) - toleranceM) return { status: 'contained' };
  const a = (r0 * r0 - r1 * r1 + d * d) / (2 * d);
  const h2 = r0 * r0 - a * a;
  const x2 = p0.x + (a * dx) / d;
  const y2 = p0.y + (a * dy) / d;
  if (h2 <= 0) return { status: 'tangent', point: { x: x2, y: y2 } };
  const h = Math.sqrt(h2);
  const right = { x: x2 + (h * dy) / d, y: y2 - (h * dx) / d };
  const left = { x: x2 - (h * dy) / d, y: y2 + (h * dx) / d };
  const cosTheta = Math.max(-1, Math.min(1, (r0 * r0 + r1 * r1 - d * d) / (2 * r0 * r1)));
  return { status: 'two_points', right, left, angleDeg: (Math.acos(cosTheta) * 180) / Math.PI };
}

/** A tie resolved to its reference point's coordinates. */
export interface TieObservation {
  x: number;
  y: number;
  distanceM: number;
}

export type TieSolution =
  | {
      ok: true;
      x: number;
      y: number;
      method: 'two_ties' | 'least_squares';
      /**
       * Estimated horizontal accuracy, metres: DRMS = σ·√trace((JᵀJ)⁻¹), σ = the tape tolerance, or for
       * three or more ties the larger of it and the residual standard error.
       */
      accuracyM: number;
      /** Root-mean-square of (computed − taped) distances, metres (0 for two ties that meet). */
      residualRmsM: number;
      /** Two ties only: angle between the ties at the point, degrees. */
      angleDeg?: number;
      /** True when the geometry is weak (ties nearly in line): accuracy worse than 2√2·σ (angle < 30°). */
      isWeak: boolean;
    }
  | { ok: false; reason: 'too_few_ties' | 'no_intersection' | 'side_hint_missing' | 'did_not_converge'; message: string };

export interface TieSolveOptions {
  /** Standard error of one taped distance, metres (default 0.05 m). */
  tapeToleranceM?: number;
  /** Side of the line from the first to the second tie's reference point. */
  sideHint?: 'left' | 'right' | undefined;
}

/**
 * Plan position from taped ties. Two ties: circle intersection, the side chosen by `sideHint`.
 * Three or more: Gauss–Newton least squares on the distances, started from the two-tie solution on the
 * hinted side (or whichever side fits all ties better when there is no hint). Metres; unrounded.
 */
export function solvePositionFromTies(ties: readonly TieObservation[], options: TieSolveOptions = {}): TieSolution {
  const sigma = options.tapeToleranceM ?? 0.05;
  const [t0, t1] = ties;
  if (t0 === undefined || t1 === undefined) {
    return { ok: false, reason: 'too_few_ties', message: 'at least two ties are needed to fix a position' };
  }
  const inter = intersectCircles(t0, t0.distanceM, t1, t1.distanceM, 3 * sigma);
  if (inter.status === 'separate' || inter.status === 'contained' || inter.status === 'concentric') {
    if (ties.length < 3) {
      return {
        ok: false,
        reason: 'no_intersection',
        message:
          inter.status === 'concentric'
            ? 'the two ties start from the same spot'
            : `the two taped distances cannot both be right (circles ${inter.status === 'separate' ? 'do not reach each other' : 'lie one inside the other'})`,
      };
    }
  }

  let start: PlanPoint;
  if (inter.status === 'two_points') {
    if (options.sideHint !== undefined) start = inter[options.sideHint];
    else if (ties.length >= 3) start = rms(ties, inter.right) <= rms(ties, inter.left) ? inter.right : inter.left;
    else return { ok: false, reason: 'side_hint_missing', message: 'two ties give two mirror positions; record which side of the line between the reference points the item is on' };
  } else if (inter.status === 'tangent') {
    start = inter.point;
  } else {
    start = { x: ties.reduce((s, t) => s + t.x, 0) / ties.length, y: ties.reduce((s, t) => s + t.y, 0) / ties.length };
  }

  if (ties.length === 2) {
    const acc = accuracy(ties, start, sigma);
    return {
      ok: true,
      x: start.x,
      y: start.y,
      method: 'two_ties',
      accuracyM: acc,
      residualRmsM: rms(ties, start),
      ...(inter.status === 'two_points' ? { angleDeg: inter.angleDeg } : {}),
      isWeak: !(acc <= 2 * Math.SQRT2 * sigma * (1 + 1e-9)),
    };
  }

  let p = { ...start };
  let converged = false;
  /** Σ sin²(θi − θj) over pairs of tie directions at p: near 0 when every tie lies along one line. */
  let spread = 0;
  for (let iter = 0; iter < 50; iter += 1) {
    let jtj00 = 0;
    let jtj01 = 0;
    let jtj11 = 0;
    let jtr0 = 0;
    let jtr1 = 0;
    for (const t of ties) {
      const dx = p.x - t.x;
      const dy = p.y - t.y;
      const dist = Math.hypot(dx, dy) || 1e-12;
      const ux = dx / dist;
      const uy = dy / dist;
      const res = dist - t.distanceM;
      jtj00 += ux * ux;
      jtj01 += ux * uy;
      jtj11 += uy * uy;
      jtr0 += ux * res;
      jtr1 += uy * res;
    }
    const det = jtj00 * jtj11 - jtj01 * jtj01;
    spread = det;
    if (Math.abs(det) < 1e-15) break;
    const stepX = -(jtj11 * jtr0 - jtj01 * jtr1) / det;
    const stepY = -(-jtj01 * jtr0 + jtj00 * jtr1) / det;
    p = { x: p.x + stepX, y: p.y + stepY };
    if (Math.hypot(stepX, stepY) < 1e-10) {
      converged = true;
      break;
    }
  }
  if (!converged || !Number.isFinite(p.x) || !Number.isFinite(p.y)) {
    // det(JᵀJ) of unit directions equals Σ sin² of the pairwise angles; below sin²(10°) per pair the
    // reference points are nearly in line with the item and no tape can fix it across that line.
    const pairs = (ties.length * (ties.length - 1)) / 2;
    const isInLine = !(spread / pairs >= Math.sin((10 * Math.PI) / 180) ** 2);
    return {
      ok: false,
      reason: 'did_not_converge',
      message: isInLine
        ? 'the reference points are nearly in line with the item, so the ties cannot fix it; tape from a reference point off that line'
        : 'the ties do not agree on one position',
    };
  }
  const residualRmsM = rms(ties, p);
  const dof = ties.length - 2;
  const residualSe = Math.sqrt((residualRmsM * residualRmsM * ties.length) / dof);
  const sigmaUsed = Math.max(sigma, residualSe);
  const acc = accuracy(ties, p, sigmaUsed);
  return {
    ok: true,
    x: p.x,
    y: p.y,
    method: 'least_squares',
    accuracyM: acc,
    residualRmsM,
    isWeak: !(acc <= 2 * Math.SQRT2 * sigmaUsed * (1 + 1e-9)),
  };
}

function rms(ties: readonly TieObservation[], p: PlanPoint): number {
  let sum = 0;
  for (const t of ties) {
    const res = Math.hypot(p.x - t.x, p.y - t.y) - t.distanceM;
    sum += res * res;
  }
  return Math.sqrt(sum / ties.length);
}

/** DRMS = σ·√trace((JᵀJ)⁻¹) with J the unit vectors from each reference point to p. */
function accuracy(ties: readonly TieObservation[], p: PlanPoint, sigma: number): number {
  let a = 0;
  let b = 0;
  let c = 0;
  for (const t of ties) {
    const dx = p.x - t.x;
    const dy = p.y - t.y;
    const dist = Math.hypot(dx, dy) || 1e-12;
    a += (dx / dist) ** 2;
    b += (dx * dy) / (dist * dist);
    c += (dy / dist) ** 2;
  }
  const det = a * c - b * b;
  if (det <= 1e-12) return Infinity;
  return sigma * Math.sqrt((a + c) / det);
}

/** Horizontal distance between two plan points, metres. */
export function planDistance(a: PlanPoint, b: PlanPoint): number {
  return Math.hypot(b.x - a.x, b.y - a.y);
}
