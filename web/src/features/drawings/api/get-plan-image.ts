import { useQuery } from '@tanstack/react-query';
import type { SitePlanImageSource } from '@drawings/job-drawings';

import { getPlanImageQueryOptions } from '../../plan';
import { getSiteQueryOptions, type SiteResponse } from '../../sites';

/** The bytes as a base64 data: URL (chunked: String.fromCharCode takes a bounded argument list). */
async function toDataUrl(blob: Blob, contentType: string): Promise<string> {
  const bytes = new Uint8Array(await blob.arrayBuffer());
  let binary = '';
  for (let i = 0; i < bytes.length; i += 0x8000) binary += String.fromCharCode(...bytes.subarray(i, i + 0x8000));
  return `data:${contentType};base64,${btoa(binary)}`;
}

type DrawablePlanImage = { image: NonNullable<SiteResponse['planImage']>; calibration: NonNullable<SiteResponse['planCalibration']> };

/** The site's image when it can be placed under the site plan (an uncalibrated image cannot). */
function drawable(site: SiteResponse | undefined): DrawablePlanImage | null {
  return site?.planImage && site.planCalibration ? { image: site.planImage, calibration: site.planCalibration } : null;
}

/**
 * The site's plan image, ready to draw under the site plan: `null` when the site has no image or it is
 * not calibrated yet. The site answer comes from the site query (usually in the cache already: the job
 * page read it) and the bytes from the plan feature's image query (the plan editor shares that entry),
 * so opening the drawings costs no request the page has made before. The image is inlined as a data:
 * URL, as the shared drawing code requires (a drawing never fetches anything itself).
 */
export function usePlanImage(siteId: string): { data: SitePlanImageSource | null | undefined; isPending: boolean; isError: boolean } {
  const site = useQuery(getSiteQueryOptions(siteId));
  const placed = drawable(site.data);
  const imageQuery = getPlanImageQueryOptions(placed?.image.url ?? '');
  const bytes = useQuery({ ...imageQuery, enabled: placed !== null });
  const source = useQuery({
    // The inlined copy of the same image: under the image's own key.
    queryKey: [...imageQuery.queryKey, 'data-url'] as const,
    queryFn: async (): Promise<SitePlanImageSource> => ({
      href: await toDataUrl(bytes.data!, placed!.image.contentType),
      widthPx: placed!.image.widthPx,
      heightPx: placed!.image.heightPx,
      calibration: placed!.calibration,
    }),
    enabled: placed !== null && bytes.data !== undefined,
    staleTime: Infinity,
  });
  if (site.isError || bytes.isError || source.isError) return { data: undefined, isPending: false, isError: true };
  if (site.isPending) return { data: undefined, isPending: true, isError: false };
  if (placed === null) return { data: null, isPending: false, isError: false };
  return { data: source.data, isPending: source.data === undefined, isError: false };
}
