import { queryOptions, useSuspenseQuery } from '@tanstack/react-query';
import { type OutboxMessageResponse, OutboxMessageResponseSchema } from '@domain/mail/outbox.schema';

import { apiRequest } from '../../../lib/api-client';

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
