import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreateSiteInput, SiteResponse, UpdateSiteInput } from '@domain/sites/site.schema';

import { apiRequest } from '../../../lib/api-client';
import { responseOf } from '../../jobs/api/response';

/** Creates a site (no `id`) or changes one. */
export function saveSite({ id, input }: { id?: string; input: CreateSiteInput | UpdateSiteInput }): Promise<SiteResponse> {
  return apiRequest(id ? `/api/sites/${encodeURIComponent(id)}` : '/api/sites', responseOf<SiteResponse>(), {
    method: id ? 'PATCH' : 'POST',
    body: input,
  });
}

export function useSaveSite() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: saveSite,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: ['sites'] }),
  });
}
