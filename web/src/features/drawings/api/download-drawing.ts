import { useMutation } from '@tanstack/react-query';

import { apiBlob } from '../../../lib/api-client';

/** Server paths of a job's drawings (the same drawings as on screen, as standalone SVG files). */
export const drawingUrls = {
  sitePlan: (jobId: string, params: { units: string; layersOff: readonly string[] }) => {
    const query = new URLSearchParams({ units: params.units });
    if (params.layersOff.length > 0) query.set('layers', params.layersOff.join(','));
    return `/api/jobs/${encodeURIComponent(jobId)}/drawings/site-plan.svg?${query}`;
  },
  schematic: (jobId: string, units: string) => `/api/jobs/${encodeURIComponent(jobId)}/drawings/schematic.svg?units=${units}`,
  depthProfile: (jobId: string, runId: string, units: string) =>
    `/api/jobs/${encodeURIComponent(jobId)}/drawings/runs/${encodeURIComponent(runId)}/depth-profile.svg?units=${units}`,
};

/**
 * Fetches a drawing from the server and saves it under `fileName`. The access token lives in memory,
 * not a cookie, so the file is fetched and handed to the browser rather than linked.
 */
export function useDownloadDrawing() {
  return useMutation({
    mutationFn: async ({ url, fileName }: { url: string; fileName: string }) => {
      const blob = await apiBlob(url, { headers: { Accept: 'image/svg+xml' } });
      const href = URL.createObjectURL(blob);
      const link = document.createElement('a');
      link.href = href;
      link.download = fileName;
      document.body.append(link);
      link.click();
      link.remove();
      window.setTimeout(() => URL.revokeObjectURL(href), 10_000);
    },
  });
}
