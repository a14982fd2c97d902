import { useMutation, useQueryClient } from '@tanstack/react-query';
import { type CreateSiteFeatureInput, SiteFeatureResponseSchema } from '@domain/sites/site-feature.schema';
import { SiteVersionResponseSchema } from '@domain/sites/site.schema';

import { apiRequest } from '../../../lib/api-client';
import { jobKeys } from '../../job-record';

import { getSiteQueryOptions } from './get-site';
import { sendSiteWrite, siteIfMatch } from './site-write';

/** A new or changed feature answers it with the site's versions; a deleted one only the versions. */
const FeatureWriteResponseSchema = SiteFeatureResponseSchema.extend(SiteVersionResponseSchema.shape);

/** Adds a landmark to a site (no `featureId`), or changes or deletes one, on top of the site's `version`. */
function writeSiteFeature(args: { siteId: string; featureId?: string; input?: CreateSiteFeatureInput; isDelete?: boolean; version: number }) {
  const base = `/api/sites/${encodeURIComponent(args.siteId)}/features`;
  const path = args.featureId ? `${base}/${encodeURIComponent(args.featureId)}` : base;
  const headers = siteIfMatch(args.version);
  if (args.isDelete) return apiRequest(path, SiteVersionResponseSchema, { method: 'DELETE', headers });
  return apiRequest(path, FeatureWriteResponseSchema, { method: args.featureId ? 'PATCH' : 'POST', ...(args.input ? { body: args.input } : {}), headers });
}

export function useWriteSiteFeature() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (args: { siteId: string; featureId?: string; input?: CreateSiteFeatureInput; isDelete?: boolean }) =>
      sendSiteWrite(queryClient, args.siteId, (version) => writeSiteFeature({ ...args, version })),
    onSuccess: (_r, { siteId }) =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: getSiteQueryOptions(siteId).queryKey }),
        // Every job's as-built on the site carries the features.
        queryClient.invalidateQueries({ queryKey: jobKeys.details() }),
      ]),
  });
}
