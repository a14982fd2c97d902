import { useMutation, useQueryClient } from '@tanstack/react-query';
import { SiteFeatureResponseSchema, type UpdateSiteFeatureInput } from '@domain/sites/site-feature.schema';
import { SiteVersionResponseSchema } from '@domain/sites/site.schema';

import { apiRequest } from '../../../lib/api-client';
import { jobKeys } from '../../job-record';

import { getSiteQueryOptions } from './get-site';
import { sendSiteWrite, siteIfMatch } from './site-write';

/** A changed feature answers it with the site's versions. */
const UpdatedFeatureResponseSchema = SiteFeatureResponseSchema.extend(SiteVersionResponseSchema.shape);

/** Changes a landmark of a site (PATCH /api/sites/:siteId/features/:featureId) on top of the site's `version`. */
export function updateSiteFeature({ siteId, featureId, input, version }: { siteId: string; featureId: string; input: UpdateSiteFeatureInput; version: number }) {
  return apiRequest(`/api/sites/${encodeURIComponent(siteId)}/features/${encodeURIComponent(featureId)}`, UpdatedFeatureResponseSchema, {
    method: 'PATCH',
    body: input,
    headers: siteIfMatch(version),
  });
}

export function useUpdateSiteFeature() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ siteId, featureId, input }: { siteId: string; featureId: string; input: UpdateSiteFeatureInput }) =>
      sendSiteWrite(queryClient, siteId, (version) => updateSiteFeature({ siteId, featureId, input, version })),
    onSuccess: (_r, { siteId }) =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: getSiteQueryOptions(siteId).queryKey }),
        // Every job's as-built on the site carries the features.
        queryClient.invalidateQueries({ queryKey: jobKeys.details() }),
      ]),
  });
}
