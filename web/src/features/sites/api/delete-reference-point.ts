import { useMutation, useQueryClient } from '@tanstack/react-query';
import { SiteVersionResponseSchema } from '@domain/sites/site.schema';

import { apiRequest } from '../../../lib/api-client';
import { jobKeys } from '../../job-record';

import { getSiteQueryOptions } from './get-site';
import { sendSiteWrite, siteIfMatch, type SiteVersionResponse } from './site-write';

/** Deletes a reference point on top of the site's `version`; the API refuses (409 IN_USE) while items are tied to it. */
export function deleteReferencePoint({ siteId, pointId, version }: { siteId: string; pointId: string; version: number }): Promise<SiteVersionResponse> {
  return apiRequest(`/api/sites/${encodeURIComponent(siteId)}/reference-points/${encodeURIComponent(pointId)}`, SiteVersionResponseSchema, {
    method: 'DELETE',
    headers: siteIfMatch(version),
  });
}

export function useDeleteReferencePoint() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (args: { siteId: string; pointId: string }) =>
      sendSiteWrite(queryClient, args.siteId, (version) => deleteReferencePoint({ ...args, version })),
    onSuccess: (_result, { siteId }) =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: getSiteQueryOptions(siteId).queryKey }),
        queryClient.invalidateQueries({ queryKey: jobKeys.details() }),
      ]),
  });
}
