import { useMutation, useQueryClient } from '@tanstack/react-query';
import { SiteVersionResponseSchema } from '@domain/sites/site.schema';

import { apiRequest } from '../../../lib/api-client';
import { jobKeys } from '../../job-record';

import { getSiteQueryOptions } from './get-site';
import { sendSiteWrite, siteIfMatch } from './site-write';

/** Deletes a landmark of a site (DELETE /api/sites/:siteId/features/:featureId) on top of the site's `version`; it answers the versions. */
export function deleteSiteFeature({ siteId, featureId, version }: { siteId: string; featureId: string; version: number }) {
  return apiRequest(`/api/sites/${encodeURIComponent(siteId)}/features/${encodeURIComponent(featureId)}`, SiteVersionResponseSchema, {
    method: 'DELETE',
    headers: siteIfMatch(version),
  });
}

export function useDeleteSiteFeature() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ siteId, featureId }: { siteId: string; featureId: string }) =>
      sendSiteWrite(queryClient, siteId, (version) => deleteSiteFeature({ siteId, featureId, version })),
    onSuccess: (_r, { siteId }) =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: getSiteQueryOptions(siteId).queryKey }),
        // Every job's as-built on the site carries the features.
        queryClient.invalidateQueries({ queryKey: jobKeys.details() }),
      ]),
  });
}
