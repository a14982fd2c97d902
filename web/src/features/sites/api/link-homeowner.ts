import { useMutation, useQueryClient } from '@tanstack/react-query';
import { HomeownerListResponseSchema, type SiteResponse } from '@domain/sites/site.schema';

import { apiRequest } from '../../../lib/api-client';

import { getSiteQueryOptions } from './get-site';

/** Lets an existing homeowner account see the site in the portal; answers the site's homeowners. */
export function linkHomeowner({ siteId, userId }: { siteId: string; userId: string }): Promise<SiteResponse['homeowners']> {
  return apiRequest(`/api/sites/${encodeURIComponent(siteId)}/homeowners`, HomeownerListResponseSchema, { method: 'POST', body: { userId } });
}

export function useLinkHomeowner() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: linkHomeowner,
    onSuccess: (_homeowners, { siteId }) => queryClient.invalidateQueries({ queryKey: getSiteQueryOptions(siteId).queryKey }),
  });
}
