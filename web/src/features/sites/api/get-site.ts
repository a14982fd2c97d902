import { queryOptions, useSuspenseQuery } from '@tanstack/react-query';
import type { SiteResponse } from '@domain/sites/site.schema';

import { apiRequest } from '../../../lib/api-client';
import { responseOf } from '../../../lib/response';

export type { SiteResponse };

export function getSite(siteId: string, { signal }: { signal?: AbortSignal } = {}): Promise<SiteResponse> {
  return apiRequest(`/api/sites/${encodeURIComponent(siteId)}`, responseOf<SiteResponse>(), { signal });
}

export function getSiteQueryOptions(siteId: string) {
  return queryOptions({
    queryKey: ['sites', 'detail', siteId],
    queryFn: ({ signal }) => getSite(siteId, { signal }),
  });
}

export function useSite(siteId: string) {
  return useSuspenseQuery(getSiteQueryOptions(siteId));
}
