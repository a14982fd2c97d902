import geographiclib from 'geographiclib-geodesic';
import { describe, expect, it } from 'vitest';

import { positionOnPlan } from './my-position';

// Oracle: GeographicLib's direct geodesic problem on the WGS 84 ellipsoid (C. F. F. Karney, "Algorithms
// for geodesics", J. Geodesy 87 (2013); the geographiclib-geodesic package). A point `s` metres from the
// origin at true azimuth `az` lies, on a plan drawn with +y at bearing `b`, at plan angle (az − b)
// clockwise from +y. Over tens of metres the tangent plane and the geodesic agree to well under 1 mm.
const WGS84 = geographiclib.Geodesic.WGS84;

describe('positionOnPlan', () => {
  const origin = { lat: 40, lon: -105 };

  it('should place a phone fix where GeographicLib’s geodesic ends, on a north-up plan and a rotated one', () => {
    for (const northAzimuthDeg of [0, 15, 290]) {
      for (const [az, s] of [
        [45, 20],
        [180, 7.5],
        [300, 60],
      ] as const) {
        const fix = WGS84.Direct(origin.lat, origin.lon, az, s);
        const p = positionOnPlan({ origin, northAzimuthDeg }, { latitude: fix.lat2!, longitude: fix.lon2!, accuracy: 6 })!;
        const planAngle = ((az - northAzimuthDeg) * Math.PI) / 180;
        expect(Math.hypot(p.x - s * Math.sin(planAngle), p.y - s * Math.cos(planAngle))).toBeLessThan(0.001);
        expect(p.accuracyM).toBe(6);
      }
    }
  });

  it('should give nothing without a GPS origin', () => {
    expect(positionOnPlan({ origin: null, northAzimuthDeg: 0 }, { latitude: 40, longitude: -105, accuracy: 5 })).toBeNull();
  });
});
