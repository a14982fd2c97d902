import { queryOptions, useQuery } from '@tanstack/react-query';
import { type HealthResponse, HealthResponseSchema } from '@domain/health/health.schema';

import { apiRequest } from '../../../lib/api-client';

export type { HealthResponse };

// A health check that hangs is itself an answer; don't keep a page waiting for it.
const HEALTH_TIMEOUT_MS = 5_000;

export function getHealth({ signal }: { signal?: AbortSignal } = {}): Promise<HealthResponse> {
  return apiRequest('/api/health', HealthResponseSchema, {
    acceptStatuses: [503],
    timeoutMs: HEALTH_TIMEOUT_MS,
    signal,
  });
}

export function getHealthQueryOptions() {
  return queryOptions({
    queryKey: ['health'],
    queryFn: ({ signal }) => getHealth({ signal }),
    staleTime: 10_000,
    // The route loader has just asked; a failed check is an answer to show, not to repeat at once.
    retry: false,
    retryOnMount: false,
  });
}

type UseHealthOptions = {
  /** Poll every this many milliseconds while the page is open. */
  refetchInterval?: number;
};

export function useHealth({ refetchInterval }: UseHealthOptions = {}) {
  return useQuery({ ...getHealthQueryOptions(), refetchInterval });
}
