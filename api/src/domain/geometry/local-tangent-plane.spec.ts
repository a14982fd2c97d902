import { readFileSync } from 'node:fs';

import geographiclib from 'geographiclib-geodesic';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';

import { polylineLengthM } from './polyline.js';
import {
  createLocalFrame,
  ecefToGeodetic,
  geodeticToEcef,
  geodeticToEnu,
  planToWgs84,
  WGS84,
  wgs84ToPlan,
} from './local-tangent-plane.js';

interface LtpFixture {
  source: string;
  wgs84: { a: number; inv_f: number; b: number; e2: number };
  metres_per_degree: { lat: number; m_per_deg_lat_formula: number; m_per_deg_lon_formula: number }[];
}

const ltp = JSON.parse(
  readFileSync(new URL('../../../../test/fixtures/reference/local_tangent_plane.json', import.meta.url), 'utf8'),
) as LtpFixture;

describe('WGS84', () => {
  // NIMA TR8350.2: a = 6 378 137 m, 1/f = 298.257223563, e² = 0.00669437999014.
  it('should hold the published ellipsoid constants', () => {
    expect(WGS84.a).toBe(ltp.wgs84.a);
    expect(1 / WGS84.f).toBeCloseTo(ltp.wgs84.inv_f, 9);
    expect(WGS84.e2).toBeCloseTo(ltp.wgs84.e2, 14);
  });
});

describe(geodeticToEcef.name, () => {
  it.each([
    [0, 0, 0, [6378137, 0, 0]],
    [0, 90, 0, [0, 6378137, 0]],
    // The pole sits at the semi-minor axis b = 6 356 752.3142 m (NIMA TR8350.2).
    [90, 0, 0, [0, 0, 6356752.3142]],
  ] as const)('should put lat %f lon %f h %f at %o', (lat, lon, h, xyz) => {
    const sut = geodeticToEcef(lat, lon, h);
    sut.forEach((v, i) => expect(v).toBeCloseTo(xyz[i]!, 3));
  });

  it('should invert through ecefToGeodetic', () => {
    const [x, y, z] = geodeticToEcef(40.123456789, -105.987654321, 1650.25);
    const g = ecefToGeodetic(x, y, z);
    expect(g.lat).toBeCloseTo(40.123456789, 11);
    expect(g.lon).toBeCloseTo(-105.987654321, 11);
    expect(g.h).toBeCloseTo(1650.25, 6);
  });
});

describe(geodeticToEnu.name, () => {
  // Metres per degree from M and N (Richardus & Adler; checked by GeographicLib): at 40° N,
  // 111 034.633 m per degree of latitude and 85 393.857 m per degree of longitude.
  it.each(ltp.metres_per_degree.map((r) => [r.lat, r.m_per_deg_lat_formula, r.m_per_deg_lon_formula] as const))(
    'should give %i° N %f m/° lat and %f m/° lon',
    (lat, mLat, mLon) => {
      const frame = createLocalFrame({ lat, lon: 10 });
      const step = 1e-4;
      const [, north] = geodeticToEnu(frame, lat + step, 10);
      const [east] = geodeticToEnu(frame, lat, 10 + step);
      expect(north / step).toBeCloseTo(mLat, 1);
      expect(east / step).toBeCloseTo(mLon, 1);
    },
  );
});

describe(planToWgs84.name, () => {
  const frame = createLocalFrame({ lat: 40, lon: -105 }, 0);

  it('should put plan +y (north-up plan) due north of the origin', () => {
    const g = planToWgs84(frame, { x: 0, y: 111.034633 });
    expect(g.lat).toBeCloseTo(40.001, 7);
    expect(g.lon).toBeCloseTo(-105, 9);
  });

  it('should rotate the plan by the north azimuth', () => {
    // Plan +y pointing 90° (east): plan (0, 100) lies 100 m east of the origin.
    const rotated = createLocalFrame({ lat: 40, lon: -105 }, 90);
    const [e, n] = geodeticToEnu(rotated, planToWgs84(rotated, { x: 0, y: 100 }).lat, planToWgs84(rotated, { x: 0, y: 100 }).lon);
    expect(e).toBeCloseTo(100, 3);
    expect(n).toBeCloseTo(0, 3);
  });

  // [GL] GeographicLib geodesics on the WGS 84 ellipsoid as an independent oracle (docs/reference.md §6):
  // the ellipsoidal local plane keeps distance and direction from the origin to within 5 mm and 0.001°
  // at 500 m (its error grows with the square of the distance: < 1 mm at 100 m, < 5 cm at 1 km).
  const WGS84 = geographiclib.Geodesic.WGS84;

  it('should agree with GeographicLib on distance and azimuth from the origin in every direction', () => {
    for (const az of [0, 30, 45, 90, 135, 200, 290]) {
      const rad = (az * Math.PI) / 180;
      const g = planToWgs84(frame, { x: 500 * Math.sin(rad), y: 500 * Math.cos(rad) });
      const inverse = WGS84.Inverse(40, -105, g.lat, g.lon);
      expect(Math.abs(inverse.s12! - 500)).toBeLessThan(0.005);
      expect(Math.abs(((inverse.azi1! - az + 540) % 360) - 180)).toBeLessThan(0.001);
    }
  });

  it('should place the end of a GeographicLib geodesic where the plan says', () => {
    for (const [az, s] of [
      [10, 100],
      [250, 100],
      [120, 1000],
    ] as const) {
      const direct = WGS84.Direct(40, -105, az, s);
      const p = wgs84ToPlan(frame, direct.lat2!, direct.lon2!);
      const rad = (az * Math.PI) / 180;
      const miss = Math.hypot(p.x - s * Math.sin(rad), p.y - s * Math.cos(rad));
      expect(miss).toBeLessThan(s <= 100 ? 0.001 : 0.05);
    }
  });

  it('should agree with GeographicLib on a route length', () => {
    const route = [
      { x: 0, y: 0 },
      { x: 40, y: 12 },
      { x: 55, y: 60 },
      { x: 10, y: 90 },
    ];
    const points = route.map((p) => planToWgs84(frame, p));
    let geodesicM = 0;
    for (let i = 1; i < points.length; i++) geodesicM += WGS84.Inverse(points[i - 1]!.lat, points[i - 1]!.lon, points[i]!.lat, points[i]!.lon).s12!;
    expect(Math.abs(geodesicM - polylineLengthM(route))).toBeLessThan(0.005);
  });

  it('should round-trip plan → WGS84 → plan within 1 mm (property)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -60, max: 60, noNaN: true }),
        fc.double({ min: -179, max: 179, noNaN: true }),
        fc.double({ min: 0, max: 359.9, noNaN: true }),
        fc.double({ min: -1000, max: 1000, noNaN: true }),
        fc.double({ min: -1000, max: 1000, noNaN: true }),
        (lat, lon, az, x, y) => {
          const f = createLocalFrame({ lat, lon }, az);
          const g = planToWgs84(f, { x, y });
          const back = wgs84ToPlan(f, g.lat, g.lon);
          expect(Math.hypot(back.x - x, back.y - y)).toBeLessThan(0.001);
        },
      ),
    );
  });
});
