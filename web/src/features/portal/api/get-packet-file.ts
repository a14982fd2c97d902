import { apiBlob } from '../../../lib/api-client';

/**
 * A revision's PDF or archive (`url` from the site's packet list). The access token lives in memory,
 * not a cookie, so the file is fetched and handed to the browser rather than linked.
 */
export function getPacketFile(url: string): Promise<Blob> {
  return apiBlob(url, { headers: { Accept: '*/*' }, timeoutMs: 120_000 });
}
