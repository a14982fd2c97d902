import { queryOptions, useQuery } from '@tanstack/react-query';
import type { SiteSummaryResponse } from '@domain/sites/site.schema';

import { apiRequest } from '../../../lib/api-client';
import { responseOf } from '../../../lib/response';

export type { SiteSummaryResponse };

export type SiteListParams = { q?: string; customerId?: string };

export function getSites(params: SiteListParams, { signal }: { signal?: AbortSignal } = {}): Promise<SiteSummaryResponse[]> {
  const search = new URLSearchParams();
  if (params.q) search.set('q', params.q);
  if (params.customerId) search.set('customerId', params.customerId);
  const query = search.toString();
  return apiRequest(`/api/sites${query ? `?${query}` : ''}`, responseOf<SiteSummaryResponse[]>(), { signal });
}

export function getSitesQueryOptions(params: SiteListParams = {}) {
  return queryOptions({
    queryKey: ['sites', 'list', params],
    queryFn: ({ signal }) => getSites(params, { signal }),
  });
}

export function useSites(params: SiteListParams = {}, { enabled = true }: { enabled?: boolean } = {}) {
  return useQuery({ ...getSitesQueryOptions(params), enabled });
}
