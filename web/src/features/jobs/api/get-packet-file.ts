import { useMutation } from '@tanstack/react-query';

import { apiBlob } from '../../../lib/api-client';

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
    mutationFn: async ({ url, fileName }: { url: string; fileName: string }) => {
      const blob = await getPacketFile(url);
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
