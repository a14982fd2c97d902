import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreateSiteInput, SiteResponse, UpdateSiteInput } from '@domain/sites/site.schema';

import { apiRequest } from '../../../lib/api-client';
import { responseOf } from '../../../lib/response';

import { sendSiteWrite, siteIfMatch, type SiteVersionResponse } from './site-write';

/** Creates a site (no `id`, no `version`) or changes one on top of `version` (If-Match). */
export function saveSite({
  id,
  input,
  version,
}: {
  id?: string;
  input: CreateSiteInput | UpdateSiteInput;
  version?: number;
}): Promise<SiteResponse & Partial<SiteVersionResponse>> {
  return apiRequest(id ? `/api/sites/${encodeURIComponent(id)}` : '/api/sites', responseOf<SiteResponse & Partial<SiteVersionResponse>>(), {
    method: id ? 'PATCH' : 'POST',
    body: input,
    ...(id ? { headers: siteIfMatch(version ?? 0) } : {}),
  });
}

/** Saves a site; a change names the version of the site this browser has (a conflict refetches it). */
export function useSaveSite() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ id, input }: { id?: string; input: CreateSiteInput | UpdateSiteInput }) =>
      id ? sendSiteWrite(queryClient, id, (version) => saveSite({ id, input, version })) : saveSite({ input }),
    onSuccess: () =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: ['sites'] }),
        // North and origin place every open job's record.
        queryClient.invalidateQueries({ queryKey: ['jobs', 'detail'] }),
      ]),
  });
}
