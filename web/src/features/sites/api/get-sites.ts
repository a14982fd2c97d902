import { queryOptions, useQuery } from '@tanstack/react-query';
import { SitePageSchema, type SiteSummaryResponse } from '@domain/sites/site.schema';

import { apiRequest } from '../../../lib/api-client';
import { type CursorPage, fetchAllPages, pageQuery } from '../../../lib/pages';

import { siteKeys } from './site-keys';

export type { SiteSummaryResponse };

export type SiteListParams = { q?: string; customerId?: string };

/** One page of the company's sites matching the parameters: the first, or the one after `cursor`. */
export function getSitesPage(
  params: SiteListParams & { cursor?: string; pageSize: number },
  { signal }: { signal?: AbortSignal } = {},
): Promise<CursorPage<SiteSummaryResponse>> {
  return apiRequest(`/api/sites${pageQuery(params)}`, SitePageSchema, { signal });
}

/** Every matching site, page by page (a customer's sites; the site picker when creating a job). */
export function getSites(params: SiteListParams, { signal }: { signal?: AbortSignal } = {}): Promise<SiteSummaryResponse[]> {
  return fetchAllPages((cursor, pageSize) => getSitesPage({ ...params, cursor, pageSize }, { signal }));
}
export function getSitesQueryOptions(params: SiteListParams = {}) {
  return queryOptions({
    queryKey: siteKeys.list(params),
    queryFn: ({ signal }) => getSites(params, { signal }),
  });
}

export function useSites(params: SiteListParams = {}, { enabled = true }: { enabled?: boolean } = {}) {
  return useQuery({ ...getSitesQueryOptions(params), enabled });
}
