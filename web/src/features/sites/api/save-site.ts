import { useMutation, useQueryClient } from '@tanstack/react-query';
import { type CreateSiteInput, type SiteResponse, SiteResponseSchema, SiteVersionResponseSchema, type UpdateSiteInput } from '@domain/sites/site.schema';

import { apiRequest } from '../../../lib/api-client';
import { jobKeys } from '../../job-record';

import { siteKeys } from './site-keys';
import { sendSiteWrite, siteIfMatch, type SiteVersionResponse } from './site-write';

/** A change answers the site with its new versions (PATCH /api/sites/:id); a new site answers the site. */
const UpdatedSiteResponseSchema = SiteResponseSchema.extend(SiteVersionResponseSchema.shape);

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
  if (!id) return apiRequest('/api/sites', SiteResponseSchema, { method: 'POST', body: input });
  return apiRequest(`/api/sites/${encodeURIComponent(id)}`, UpdatedSiteResponseSchema, { method: 'PATCH', body: input, headers: siteIfMatch(version ?? 0) });
}

/** Saves a site; a change names the version of the site this browser has (a conflict refetches it). */
export function useSaveSite() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ id, input }: { id?: string; input: CreateSiteInput | UpdateSiteInput }) =>
      id ? sendSiteWrite(queryClient, id, (version) => saveSite({ id, input, version })) : saveSite({ input }),
    onSuccess: () =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: siteKeys.all }),
        // North and origin place every open job's record.
        queryClient.invalidateQueries({ queryKey: jobKeys.details() }),
      ]),
  });
}
