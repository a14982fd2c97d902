import { queryOptions, useQuery } from '@tanstack/react-query';
import { type LocateViewResponse, LocateViewResponseSchema } from '@domain/locate/locate-link.schema';

import { apiRequest, isApiError } from '../../../lib/api-client';

export type { LocateViewResponse };

/** The public locate view for a link's token. No session: whoever holds the link may read it. */
export function getLocateView(token: string, { signal }: { signal?: AbortSignal } = {}): Promise<LocateViewResponse> {
  return apiRequest(`/api/locate/${encodeURIComponent(token)}`, LocateViewResponseSchema, { signal, auth: false });
}

export function getLocateViewQueryOptions(token: string) {
  return queryOptions({
    queryKey: ['locate', token],
    queryFn: ({ signal }) => getLocateView(token, { signal }),
    // Every open is logged and a miss counts towards the rate limit: never retry a refusal.
    retry: (failureCount, error) => !(isApiError(error) && (error.status === 404 || error.status === 429)) && failureCount < 2,
    staleTime: 5 * 60_000,
    refetchOnWindowFocus: false,
    // The loader already asked; a refusal shown on mount must not be asked again (it counts as a miss).
    retryOnMount: false,
  });
}

export function useLocateView(token: string) {
  return useQuery(getLocateViewQueryOptions(token));
}
