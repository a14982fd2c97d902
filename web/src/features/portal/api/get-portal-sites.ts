import { queryOptions, useSuspenseQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { type PortalSiteResponse, PortalSiteResponseSchema } from '@domain/delivery/portal.schema';

import { apiRequest } from '../../../lib/api-client';

export type { PortalSiteResponse };

/** The signed-in homeowner's sites. */
export function getPortalSites({ signal }: { signal?: AbortSignal } = {}): Promise<PortalSiteResponse[]> {
  return apiRequest('/api/portal/sites', z.array(PortalSiteResponseSchema), { signal });
}

export function getPortalSitesQueryOptions() {
  return queryOptions({
    queryKey: ['portal', 'sites'],
    queryFn: ({ signal }) => getPortalSites({ signal }),
  });
}

export function usePortalSites() {
  return useSuspenseQuery(getPortalSitesQueryOptions());
}
