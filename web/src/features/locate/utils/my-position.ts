import { createLocalFrame, wgs84ToPlan } from '@domain/geometry/local-tangent-plane';
import type { SiteMap } from '@domain/locate/site-map.schema';

/** The viewer's position on the site plan (metres) with the phone's stated accuracy radius (metres). */
export interface PlanPosition {
  x: number;
  y: number;
  accuracyM: number;
}

/**
 * A phone position (WGS 84 degrees, as `navigator.geolocation` reports it) on the site plan, through the
 * same local tangent plane as the map's GeoJSON (site origin + the plan's north azimuth). Null when the
 * site has no GPS origin. The phone gives no ellipsoidal height we trust, so the origin's height is used:
 * within 1 km of the origin that changes the plan point by less than 1 mm (local-tangent-plane.ts).
 */
export function positionOnPlan(
  frame: SiteMap['frame'],
  coords: { latitude: number; longitude: number; accuracy: number },
): PlanPosition | null {
  if (!frame.origin) return null;
  const local = createLocalFrame(frame.origin, frame.northAzimuthDeg);
  const p = wgs84ToPlan(local, coords.latitude, coords.longitude);
  return { x: p.x, y: p.y, accuracyM: Math.max(0, coords.accuracy) };
}
