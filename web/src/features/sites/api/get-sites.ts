import { queryOptions, useQuery } from '@tanstack/react-query';
import type { SiteSummaryResponse } from '@domain/sites/site.schema';

import { apiRequest } from '../../../lib/api-client';
import { fetchAllPages, type Page, pageQuery } from '../../../lib/pages';
import { responseOf } from '../../../lib/response';

export type { SiteSummaryResponse };

export type SiteListParams = { q?: string; customerId?: string };

/** One page of the company's sites matching the parameters. */
export function getSitesPage(
  params: SiteListParams & { page: number; pageSize: number },
  { signal }: { signal?: AbortSignal } = {},
): Promise<Page<SiteSummaryResponse>> {
  return apiRequest(`/api/sites${pageQuery(params)}`, responseOf<Page<SiteSummaryResponse>>(), { signal });
}

/** Every matching site, page by page (a customer's sites; the site picker when creating a job). */
export function getSites(params: SiteListParams, { signal }: { signal?: AbortSignal } = {}): Promise<SiteSummaryResponse[]> {
  return fetchAllPages((page, pageSize) => getSitesPage({ ...params, page, pageSize }, { signal }));
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
