import { apiBlob } from '../../../lib/api-client';

/**
 * A captured message's attachment, its bytes (GET /api/outbox/:id/attachments/:attachmentId). A plain
 * link cannot carry the access token (it lives in memory, not in a cookie), so the file is fetched and
 * handed to the browser as a download.
 */
export function getOutboxAttachment(messageId: string, attachmentId: string): Promise<Blob> {
  return apiBlob(`/api/outbox/${encodeURIComponent(messageId)}/attachments/${encodeURIComponent(attachmentId)}`, {
    headers: { Accept: '*/*' },
    timeoutMs: 60_000,
  });
}
