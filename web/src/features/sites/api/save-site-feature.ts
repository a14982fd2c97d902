import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreateSiteFeatureInput, SiteFeatureResponse } from '@domain/sites/site-feature.schema';

import { apiRequest } from '../../../lib/api-client';
import { responseOf } from '../../../lib/response';

import { getSiteQueryOptions } from './get-site';
import { sendSiteWrite, siteIfMatch, type SiteVersionResponse } from './site-write';

/** Adds a landmark to a site (no `featureId`), or changes or deletes one, on top of the site's `version`. */
function writeSiteFeature(args: { siteId: string; featureId?: string; input?: CreateSiteFeatureInput; isDelete?: boolean; version: number }) {
  const base = `/api/sites/${encodeURIComponent(args.siteId)}/features`;
  const path = args.featureId ? `${base}/${encodeURIComponent(args.featureId)}` : base;
  return apiRequest(path, responseOf<Partial<SiteFeatureResponse> & SiteVersionResponse>(), {
    method: args.isDelete ? 'DELETE' : args.featureId ? 'PATCH' : 'POST',
    ...(args.input ? { body: args.input } : {}),
    headers: siteIfMatch(args.version),
  });
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
        queryClient.invalidateQueries({ queryKey: ['jobs', 'detail'] }),
      ]),
  });
}
