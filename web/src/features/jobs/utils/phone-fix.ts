import type { SiteFrame } from '@domain/as-built/as-built.schema';
import { createLocalFrame, wgs84ToPlan } from '@domain/geometry/local-tangent-plane';

/** A phone fix on the site plan (metres), with the phone's stated accuracy radius (metres). */
export type GpsFix = { x: number; y: number; accuracyM: number };

/**
 * A phone position (WGS 84 degrees, as `navigator.geolocation` reports it) on the plan through the
 * site's local tangent plane (origin + the plan's north azimuth), the same conversion as the locate
 * map. Undefined without a GPS origin.
 */
export function gpsFixOnPlan(site: SiteFrame | undefined, coords: { latitude: number; longitude: number; accuracy: number }): GpsFix | undefined {
  if (!site?.origin) return undefined;
  const p = wgs84ToPlan(createLocalFrame(site.origin, site.northAzimuthDeg), coords.latitude, coords.longitude);
  return { x: p.x, y: p.y, accuracyM: Math.min(10_000, Math.max(0, coords.accuracy)) };
}

/** What to tell the crew when the phone gives no position (`GeolocationPositionError.code`, or none). */
export function phoneFixFailure(code: number | undefined): string {
  if (code === 1) return 'Location permission was refused: allow it for this site in the browser settings, or tape ties.';
  if (code === 3) return 'The phone did not find its position in time. Try again in the open, or tape ties.';
  return 'This device cannot give its position. Tape ties instead.';
}

/**
 * Asks the phone once for a fresh, high-accuracy position and puts it on the site's plan. Rejects with
 * an Error whose message says what to do (no permission, no fix in time, no GPS on this device).
 */
export function requestPhoneFix(site: SiteFrame | undefined): Promise<GpsFix> {
  return new Promise((resolve, reject) => {
    if (!site?.origin) {
      reject(new Error('This site has no GPS origin, so a phone position cannot be put on its plan. Tape ties instead.'));
      return;
    }
    if (typeof navigator === 'undefined' || !navigator.geolocation) {
      reject(new Error(phoneFixFailure(undefined)));
      return;
    }
    navigator.geolocation.getCurrentPosition(
      (position) => {
        const fix = gpsFixOnPlan(site, position.coords);
        if (fix) resolve(fix);
        else reject(new Error(phoneFixFailure(undefined)));
      },
      (error) => reject(new Error(phoneFixFailure(error.code))),
      { enableHighAccuracy: true, maximumAge: 0, timeout: 30_000 },
    );
  });
}
