import { length, lineString } from '@turf/turf';
import { describe, expect, it } from 'vitest';

import { compareRouteLength, polylineLengthM } from './polyline.js';

describe(polylineLengthM.name, () => {
  it.each([
    [[], 0],
    [[{ x: 1, y: 1 }], 0],
    [[{ x: 0, y: 0 }, { x: 3, y: 4 }], 5],
    [[{ x: 0, y: 0 }, { x: 3, y: 4 }, { x: 3, y: 10 }], 11],
  ])('should measure %o as %f m', (points, metres) => {
    expect(polylineLengthM(points)).toBeCloseTo(metres, 12);
  });

  // Turf's planar-agnostic check: a polyline of tiny degree steps near the equator measured by Turf
  // (haversine) in metres matches the same shape scaled to metres (1e-5° ≈ 1.11195 m on Turf's sphere).
  it('should agree with Turf on a small equatorial polyline', () => {
    const deg = [
      [0, 0],
      [3e-5, 4e-5],
      [3e-5, 10e-5],
    ];
    const metresPerDeg = (6371008.8 * Math.PI) / 180;
    const plan = deg.map(([x, y]) => ({ x: x! * metresPerDeg, y: y! * metresPerDeg }));
    expect(polylineLengthM(plan)).toBeCloseTo(length(lineString(deg), { units: 'meters' }), 6);
  });
});

describe(compareRouteLength.name, () => {
  // Common practice (no published source): a drawn route may differ from the measured cable by the larger of
  // 1 m and 10 % (slack, risers and service loops at each end).
  it.each([
    [20, 21.5, false], // within 10 % of 21.5 m = 2.15 m
    [20, 23, true],
    [5, 5.9, false], // short run: the 1 m floor applies
    [5, 6.2, true],
    [30, 25, true], // a route longer than the cable is wrong too
  ])('should compare a %f m route with %f m measured → mismatch %s', (route, measured, mismatch) => {
    expect(compareRouteLength(route, measured).isMismatch).toBe(mismatch);
  });
});
