import { createHash } from 'node:crypto';

import type { Site } from '../db/schema/index.js';
import type { PlanImageResponse } from '../domain/sites/site.schema.js';

/** A short, stable version of the stored image: a new upload gets a new key, so a new version. */
export function planImageVersion(ref: string): string {
  return createHash('sha256').update(ref).digest('hex').slice(0, 12);
}

export function planImageEtag(ref: string): string {
  return `"plan-${planImageVersion(ref)}"`;
}

export function toPlanImageResponse(site: Site): PlanImageResponse | null {
  if (site.planImageRef === null || site.planImageWidthPx === null || site.planImageHeightPx === null || site.planImageContentType === null) {
    return null;
  }
  return {
    widthPx: site.planImageWidthPx,
    heightPx: site.planImageHeightPx,
    contentType: site.planImageContentType,
    url: `/api/sites/${site.id}/plan-image?v=${planImageVersion(site.planImageRef)}`,
  };
}

/** The calibration columns, or null when the site has none. */
export function planCalibrationOf(site: Site) {
  return site.planCalAx !== null && site.planCalAy !== null && site.planCalBx !== null && site.planCalBy !== null && site.planCalDistanceM !== null
    ? { a: { x: site.planCalAx, y: site.planCalAy }, b: { x: site.planCalBx, y: site.planCalBy }, distanceM: site.planCalDistanceM }
    : null;
}
