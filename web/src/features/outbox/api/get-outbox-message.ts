import { queryOptions, useSuspenseQuery } from '@tanstack/react-query';
import { type OutboxMessageResponse, OutboxMessageResponseSchema } from '@domain/mail/outbox.schema';

import { apiBlob, apiRequest } from '../../../lib/api-client';

export type { OutboxMessageResponse };

export function getOutboxMessage(id: string, { signal }: { signal?: AbortSignal } = {}) {
  return apiRequest(`/api/outbox/${encodeURIComponent(id)}`, OutboxMessageResponseSchema, { signal });
}

export function getOutboxMessageQueryOptions(id: string) {
  return queryOptions({
    queryKey: ['outbox', 'detail', id],
    queryFn: ({ signal }) => getOutboxMessage(id, { signal }),
    // A captured message never changes.
    staleTime: Infinity,
  });
}

export function useOutboxMessage(id: string) {
  return useSuspenseQuery(getOutboxMessageQueryOptions(id));
}

/**
 * The attachment's bytes. A plain link cannot carry the access token (it lives in memory, not in a
 * cookie), so the file is fetched and handed to the browser as a download.
 */
export function getOutboxAttachment(messageId: string, attachmentId: string): Promise<Blob> {
  return apiBlob(`/api/outbox/${encodeURIComponent(messageId)}/attachments/${encodeURIComponent(attachmentId)}`, {
    headers: { Accept: '*/*' },
    timeoutMs: 60_000,
  });
}
