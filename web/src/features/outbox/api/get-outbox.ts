import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { type OutboxListResponse, OutboxListResponseSchema } from '@domain/mail/outbox.schema';

import { apiRequest, isApiError } from '../../../lib/api-client';

export type { OutboxListResponse };

export const OUTBOX_PAGE_SIZE = 25;

/**
 * One page of captured mail, newest first; `null` when the server sends mail through a hosted service
 * and keeps no local copies (404 `NO_LOCAL_MAIL`), so there is no outbox to show.
 */
export async function getOutbox(
  { page }: { page: number },
  { signal }: { signal?: AbortSignal } = {},
): Promise<OutboxListResponse | null> {
  try {
    return await apiRequest(`/api/outbox?page=${page}&pageSize=${OUTBOX_PAGE_SIZE}`, OutboxListResponseSchema, {
      signal,
    });
  } catch (error) {
    if (isApiError(error) && error.status === 404 && error.code === 'NO_LOCAL_MAIL') return null;
    throw error;
  }
}

export function getOutboxQueryOptions({ page }: { page: number }) {
  return queryOptions({
    queryKey: ['outbox', 'list', { page }],
    queryFn: ({ signal }) => getOutbox({ page }, { signal }),
    // New mail arrives while a developer waits for it.
    staleTime: 5_000,
  });
}

export function useOutbox({ page }: { page: number }) {
  return useQuery({ ...getOutboxQueryOptions({ page }), placeholderData: keepPreviousData, refetchInterval: 15_000 });
}
