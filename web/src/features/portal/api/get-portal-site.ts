import { queryOptions, useSuspenseQuery } from '@tanstack/react-query';
import { type PortalPacket, type PortalSiteDetailResponse, PortalSiteDetailResponseSchema } from '@domain/delivery/portal.schema';

import { apiRequest } from '../../../lib/api-client';

export type { PortalPacket, PortalSiteDetailResponse };

/** One of the homeowner's sites with every issued revision there. */
export function getPortalSite(siteId: string, { signal }: { signal?: AbortSignal } = {}): Promise<PortalSiteDetailResponse> {
  return apiRequest(`/api/portal/sites/${encodeURIComponent(siteId)}`, PortalSiteDetailResponseSchema, { signal });
}

export function getPortalSiteQueryOptions(siteId: string) {
  return queryOptions({
    queryKey: ['portal', 'sites', siteId],
    queryFn: ({ signal }) => getPortalSite(siteId, { signal }),
  });
}

export function usePortalSite(siteId: string) {
  return useSuspenseQuery(getPortalSiteQueryOptions(siteId));
}
