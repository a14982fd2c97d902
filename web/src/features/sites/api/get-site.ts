import { queryOptions, useSuspenseQuery } from '@tanstack/react-query';
import { type SiteResponse, SiteResponseSchema } from '@domain/sites/site.schema';

import { apiRequest } from '../../../lib/api-client';

import { siteKeys } from './site-keys';

export type { SiteResponse };

export function getSite(siteId: string, { signal }: { signal?: AbortSignal } = {}): Promise<SiteResponse> {
  return apiRequest(`/api/sites/${encodeURIComponent(siteId)}`, SiteResponseSchema, { signal });
}

export function getSiteQueryOptions(siteId: string) {
  return queryOptions({
    queryKey: siteKeys.detail(siteId),
    queryFn: ({ signal }) => getSite(siteId, { signal }),
  });
}

export function useSite(siteId: string) {
  return useSuspenseQuery(getSiteQueryOptions(siteId));
}
