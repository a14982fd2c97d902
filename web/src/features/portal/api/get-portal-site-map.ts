import { queryOptions, useQuery } from '@tanstack/react-query';
import { type SiteMap, SiteMapSchema } from '@domain/locate/site-map.schema';

import { apiRequest } from '../../../lib/api-client';

export type { SiteMap };

/** The site's cumulative buried-cable map (plan coordinates). */
export function getPortalSiteMap(siteId: string, { signal }: { signal?: AbortSignal } = {}): Promise<SiteMap> {
  return apiRequest(`/api/portal/sites/${encodeURIComponent(siteId)}/map`, SiteMapSchema, { signal });
}

export function getPortalSiteMapQueryOptions(siteId: string) {
  return queryOptions({
    queryKey: ['portal', 'sites', siteId, 'map'],
    queryFn: ({ signal }) => getPortalSiteMap(siteId, { signal }),
  });
}

export function usePortalSiteMap(siteId: string) {
  return useQuery(getPortalSiteMapQueryOptions(siteId));
}
