import { useMutation, useQueryClient } from '@tanstack/react-query';
import { type CreateSiteInput, type SiteResponse, SiteResponseSchema } from '@domain/sites/site.schema';

import { apiRequest } from '../../../lib/api-client';

import { siteKeys } from './site-keys';

/** Creates a site for a customer (POST /api/sites); it answers the new site. */
export function createSite(input: CreateSiteInput): Promise<SiteResponse> {
  return apiRequest('/api/sites', SiteResponseSchema, { method: 'POST', body: input });
}

export function useCreateSite() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createSite,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: siteKeys.all }),
  });
}
