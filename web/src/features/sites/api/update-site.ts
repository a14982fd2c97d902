import { useMutation, useQueryClient } from '@tanstack/react-query';
import { type SiteResponse, SiteResponseSchema, SiteVersionResponseSchema, type UpdateSiteInput } from '@domain/sites/site.schema';

import { apiRequest } from '../../../lib/api-client';
import { jobKeys } from '../../job-record';

import { siteKeys } from './site-keys';
import { sendSiteWrite, siteIfMatch, type SiteVersionResponse } from './site-write';

/** A change answers the site with its new versions (PATCH /api/sites/:id). */
const UpdatedSiteResponseSchema = SiteResponseSchema.extend(SiteVersionResponseSchema.shape);

/** Changes a site on top of `version` (If-Match). */
export function updateSite({ id, input, version }: { id: string; input: UpdateSiteInput; version: number }): Promise<SiteResponse & SiteVersionResponse> {
  return apiRequest(`/api/sites/${encodeURIComponent(id)}`, UpdatedSiteResponseSchema, { method: 'PATCH', body: input, headers: siteIfMatch(version) });
}

/** Changes a site on the version of it this browser has (a conflict refetches it). */
export function useUpdateSite() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ id, input }: { id: string; input: UpdateSiteInput }) => sendSiteWrite(queryClient, id, (version) => updateSite({ id, input, version })),
    onSuccess: () =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: siteKeys.all }),
        // North and origin place every open job's record.
        queryClient.invalidateQueries({ queryKey: jobKeys.details() }),
      ]),
  });
}
