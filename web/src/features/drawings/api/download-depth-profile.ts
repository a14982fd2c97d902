import { useMutation } from '@tanstack/react-query';

import { apiBlob } from '../../../lib/api-client';
import { saveFile } from '../../../lib/save-file';

export type DepthProfileDownload = { jobId: string; runId: string; units: string; fileName: string };

/** `GET /api/jobs/:id/drawings/runs/:runId/depth-profile.svg?units`: one run's depth profile as an SVG file. */
export function getDepthProfileSvg({ jobId, runId, units }: Omit<DepthProfileDownload, 'fileName'>): Promise<Blob> {
  const query = new URLSearchParams({ units });
  return apiBlob(`/api/jobs/${encodeURIComponent(jobId)}/drawings/runs/${encodeURIComponent(runId)}/depth-profile.svg?${query}`, {
    headers: { Accept: 'image/svg+xml' },
  });
}

export function useDownloadDepthProfile() {
  return useMutation({
    mutationFn: async ({ fileName, ...drawing }: DepthProfileDownload) => saveFile(await getDepthProfileSvg(drawing), fileName),
  });
}
