import { useMutation } from '@tanstack/react-query';

import { apiBlob } from '../../../lib/api-client';
import { saveFile } from '../../../lib/save-file';

/**
 * A revision's PDF or archive (`url` from the packet list). The access token lives in memory, not a
 * cookie, so the file is fetched and handed to the browser rather than linked.
 */
export function getPacketFile(url: string): Promise<Blob> {
  return apiBlob(url, { headers: { Accept: '*/*' }, timeoutMs: 120_000 });
}

/** Fetches the file and saves it under `fileName`. */
export function useDownloadPacketFile() {
  return useMutation({
    mutationFn: async ({ url, fileName }: { url: string; fileName: string }) => saveFile(await getPacketFile(url), fileName),
  });
}
