import { useMutation, useQueryClient } from '@tanstack/react-query';
import { type CreateSiteFeatureInput, SiteFeatureResponseSchema } from '@domain/sites/site-feature.schema';
import { SiteVersionResponseSchema } from '@domain/sites/site.schema';

import { apiRequest } from '../../../lib/api-client';
import { jobKeys } from '../../job-record';

import { getSiteQueryOptions } from './get-site';
import { sendSiteWrite, siteIfMatch } from './site-write';

/** A new feature answers it with the site's versions. */
const CreatedFeatureResponseSchema = SiteFeatureResponseSchema.extend(SiteVersionResponseSchema.shape);

/** Adds a landmark to a site (POST /api/sites/:siteId/features) on top of the site's `version`. */
export function createSiteFeature({ siteId, input, version }: { siteId: string; input: CreateSiteFeatureInput; version: number }) {
  return apiRequest(`/api/sites/${encodeURIComponent(siteId)}/features`, CreatedFeatureResponseSchema, {
    method: 'POST',
    body: input,
    headers: siteIfMatch(version),
  });
}

export function useCreateSiteFeature() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ siteId, input }: { siteId: string; input: CreateSiteFeatureInput }) =>
      sendSiteWrite(queryClient, siteId, (version) => createSiteFeature({ siteId, input, version })),
    onSuccess: (_r, { siteId }) =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: getSiteQueryOptions(siteId).queryKey }),
        // Every job's as-built on the site carries the features.
        queryClient.invalidateQueries({ queryKey: jobKeys.details() }),
      ]),
  });
}
