import { queryOptions, useQuery } from '@tanstack/react-query';
import { SiteResponseSchema } from '@domain/sites/site.schema';
import type { SitePlanImageSource } from '@drawings/job-drawings';

import { apiBlob, apiRequest } from '../../../lib/api-client';

/** The bytes as a base64 data: URL (chunked: String.fromCharCode takes a bounded argument list). */
async function toDataUrl(blob: Blob, contentType: string): Promise<string> {
  const bytes = new Uint8Array(await blob.arrayBuffer());
  let binary = '';
  for (let i = 0; i < bytes.length; i += 0x8000) binary += String.fromCharCode(...bytes.subarray(i, i + 0x8000));
  return `data:${contentType};base64,${btoa(binary)}`;
}

/**
 * The site's plan image, ready to draw under the site plan: `null` when the site has no image or it is
 * not calibrated yet (an uncalibrated image cannot be placed). The image is inlined as a data: URL,
 * as the shared drawing code requires (a drawing never fetches anything itself).
 */
export async function getPlanImage(siteId: string, { signal }: { signal?: AbortSignal } = {}): Promise<SitePlanImageSource | null> {
  const site = await apiRequest(`/api/sites/${encodeURIComponent(siteId)}`, SiteResponseSchema, { signal });
  if (!site.planImage || !site.planCalibration) return null;
  const blob = await apiBlob(site.planImage.url, { signal, headers: { Accept: 'image/*' } });
  return {
    href: await toDataUrl(blob, site.planImage.contentType),
    widthPx: site.planImage.widthPx,
    heightPx: site.planImage.heightPx,
    calibration: site.planCalibration,
  };
}

export function getPlanImageQueryOptions(siteId: string) {
  return queryOptions({
    queryKey: ['sites', 'detail', siteId, 'plan-image'],
    queryFn: ({ signal }) => getPlanImage(siteId, { signal }),
  });
}

export function usePlanImage(siteId: string) {
  return useQuery(getPlanImageQueryOptions(siteId));
}
