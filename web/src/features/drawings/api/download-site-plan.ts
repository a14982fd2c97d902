import { useMutation } from '@tanstack/react-query';

import { apiBlob } from '../../../lib/api-client';
import { saveFile } from '../../../lib/save-file';

export type SitePlanDownload = { jobId: string; units: string; layersOff: readonly string[]; fileName: string };

/** `GET /api/jobs/:id/drawings/site-plan.svg?units&layers`: the site plan as a standalone SVG file. */
export function getSitePlanSvg({ jobId, units, layersOff }: Omit<SitePlanDownload, 'fileName'>): Promise<Blob> {
  const query = new URLSearchParams({ units });
  if (layersOff.length > 0) query.set('layers', layersOff.join(','));
  return apiBlob(`/api/jobs/${encodeURIComponent(jobId)}/drawings/site-plan.svg?${query}`, { headers: { Accept: 'image/svg+xml' } });
}

export function useDownloadSitePlan() {
  return useMutation({
    mutationFn: async ({ fileName, ...drawing }: SitePlanDownload) => saveFile(await getSitePlanSvg(drawing), fileName),
  });
}
