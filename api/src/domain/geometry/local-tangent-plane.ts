import type { PlanPoint } from '../as-built/common.schema.js';

/** WGS 84 ellipsoid (NIMA TR8350.2): semi-major axis a (m) and flattening f; e² = f(2 − f). */
export const WGS84 = {
  a: 6_378_137,
  f: 1 / 298.257223563,
  e2: (1 / 298.257223563) * (2 - 1 / 298.257223563),
} as const;

const DEG = Math.PI / 180;

export interface Geodetic {
  /** Latitude, degrees north. */
  lat: number;
  /** Longitude, degrees east. */
  lon: number;
  /** Height above the ellipsoid, metres. */
  h: number;
}

/** Geodetic (degrees, metres) → Earth-centred Earth-fixed X, Y, Z (metres) on WGS 84. */
export function geodeticToEcef(lat: number, lon: number, h = 0): [number, number, number] {
  const phi = lat * DEG;
  const lambda = lon * DEG;
  const sinPhi = Math.sin(phi);
  const n = WGS84.a / Math.sqrt(1 - WGS84.e2 * sinPhi * sinPhi);
  const cosPhi = Math.cos(phi);
  return [(n + h) * cosPhi * Math.cos(lambda), (n + h) * cosPhi * Math.sin(lambda), (n * (1 - WGS84.e2) + h) * sinPhi];
}

/**
 * ECEF → geodetic by fixed-point iteration on latitude (converges to < 1e-12 rad in a few steps for
 * points near the surface). Degrees and metres.
 */
export function ecefToGeodetic(x: number, y: number, z: number): Geodetic {
  const p = Math.hypot(x, y);
  const lambda = Math.atan2(y, x);
  let phi = Math.atan2(z, p * (1 - WGS84.e2));
  let n = WGS84.a;
  for (let i = 0; i < 10; i += 1) {
    const sinPhi = Math.sin(phi);
    n = WGS84.a / Math.sqrt(1 - WGS84.e2 * sinPhi * sinPhi);
    const next = Math.atan2(z + WGS84.e2 * n * sinPhi, p);
    if (Math.abs(next - phi) < 1e-14) {
      phi = next;
      break;
    }
    phi = next;
  }
  const sinPhi = Math.sin(phi);
  n = WGS84.a / Math.sqrt(1 - WGS84.e2 * sinPhi * sinPhi);
  const cosPhi = Math.cos(phi);
  const h = Math.abs(cosPhi) > 1e-10 ? p / cosPhi - n : Math.abs(z) / Math.abs(sinPhi) - n * (1 - WGS84.e2);
  return { lat: phi / DEG, lon: lambda / DEG, h };
}

/**
 * A local tangent plane (east-north-up) at the site origin, plus the site plan's rotation.
 * `northAzimuthDeg` is the true bearing of the plan's +y axis (0 = plan drawn north-up).
 */
export interface LocalFrame {
  origin: Geodetic;
  northAzimuthDeg: number;
  readonly ecef0: readonly [number, number, number];
  readonly sinLat: number;
  readonly cosLat: number;
  readonly sinLon: number;
  readonly cosLon: number;
  readonly sinAz: number;
  readonly cosAz: number;
}

/** Builds the frame for a site origin (degrees; height metres above the ellipsoid, default 0). */
export function createLocalFrame(origin: { lat: number; lon: number; heightM?: number | undefined }, northAzimuthDeg = 0): LocalFrame {
  const h = origin.heightM ?? 0;
  return {
    origin: { lat: origin.lat, lon: origin.lon, h },
    northAzimuthDeg,
    ecef0: geodeticToEcef(origin.lat, origin.lon, h),
    sinLat: Math.sin(origin.lat * DEG),
    cosLat: Math.cos(origin.lat * DEG),
    sinLon: Math.sin(origin.lon * DEG),
    cosLon: Math.cos(origin.lon * DEG),
    sinAz: Math.sin(northAzimuthDeg * DEG),
    cosAz: Math.cos(northAzimuthDeg * DEG),
  };
}

/** Geodetic → east, north, up (metres) in the frame's tangent plane (rotation of the ECEF difference). */
export function geodeticToEnu(frame: LocalFrame, lat: number, lon: number, h = frame.origin.h): [number, number, number] {
  const [x, y, z] = geodeticToEcef(lat, lon, h);
  const dx = x - frame.ecef0[0];
  const dy = y - frame.ecef0[1];
  const dz = z - frame.ecef0[2];
  const { sinLat, cosLat, sinLon, cosLon } = frame;
  const e = -sinLon * dx + cosLon * dy;
  const n = -sinLat * cosLon * dx - sinLat * sinLon * dy + cosLat * dz;
  const u = cosLat * cosLon * dx + cosLat * sinLon * dy + sinLat * dz;
  return [e, n, u];
}

/** East, north, up (metres) → geodetic. */
export function enuToGeodetic(frame: LocalFrame, e: number, n: number, u = 0): Geodetic {
  const { sinLat, cosLat, sinLon, cosLon } = frame;
  const dx = -sinLon * e - sinLat * cosLon * n + cosLat * cosLon * u;
  const dy = cosLon * e - sinLat * sinLon * n + cosLat * sinLon * u;
  const dz = cosLat * n + sinLat * u;
  return ecefToGeodetic(frame.ecef0[0] + dx, frame.ecef0[1] + dy, frame.ecef0[2] + dz);
}

/** Plan (x, y metres) → east/north metres: E = x·cos b + y·sin b, N = −x·sin b + y·cos b (b = north azimuth of plan +y). */
export function planToEnu(frame: LocalFrame, p: PlanPoint): [number, number] {
  return [p.x * frame.cosAz + p.y * frame.sinAz, -p.x * frame.sinAz + p.y * frame.cosAz];
}

/** East/north metres → plan (x, y metres); inverse of {@link planToEnu}. */
export function enuToPlan(frame: LocalFrame, e: number, n: number): PlanPoint {
  return { x: e * frame.cosAz - n * frame.sinAz, y: e * frame.sinAz + n * frame.cosAz };
}

/**
 * Plan point (on the tangent plane at the origin's height) → WGS 84 longitude/latitude in degrees and
 * ellipsoidal height in metres. Unrounded (round only when writing GeoJSON).
 */
export function planToWgs84(frame: LocalFrame, p: PlanPoint): Geodetic {
  const [e, n] = planToEnu(frame, p);
  return enuToGeodetic(frame, e, n, 0);
}

/**
 * WGS 84 (degrees; height metres, default: the tangent plane's height at that spot is unknown so the
 * origin's height is used) → plan point. Without the height the error is below 1 mm within 1 km of the
 * origin (the tangent plane rises d²/2R above the ellipsoid; the horizontal effect is of order d³/R²).
 */
export function wgs84ToPlan(frame: LocalFrame, lat: number, lon: number, h?: number): PlanPoint {
  const [e, n] = geodeticToEnu(frame, lat, lon, h ?? frame.origin.h);
  return enuToPlan(frame, e, n);
}
