import { useMutation } from '@tanstack/react-query';

import { apiBlob } from '../../../lib/api-client';
import { saveFile } from '../../../lib/save-file';

export type SchematicDownload = { jobId: string; units: string; fileName: string };

/** `GET /api/jobs/:id/drawings/schematic.svg?units`: the wiring schematic as a standalone SVG file. */
export function getSchematicSvg({ jobId, units }: Omit<SchematicDownload, 'fileName'>): Promise<Blob> {
  const query = new URLSearchParams({ units });
  return apiBlob(`/api/jobs/${encodeURIComponent(jobId)}/drawings/schematic.svg?${query}`, { headers: { Accept: 'image/svg+xml' } });
}

export function useDownloadSchematic() {
  return useMutation({
    mutationFn: async ({ fileName, ...drawing }: SchematicDownload) => saveFile(await getSchematicSvg(drawing), fileName),
  });
}
