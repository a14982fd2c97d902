import { useMutation, useQueryClient } from '@tanstack/react-query';
import { type PlanCalibration, type SiteResponse, SiteResponseSchema, SiteVersionResponseSchema } from '@domain/sites/site.schema';

import { apiRequest } from '../../../lib/api-client';
import { jobKeys } from '../../job-record';
import { getSiteQueryOptions } from '../../sites';
import { sendSiteWrite, siteIfMatch, type SiteVersionResponse } from '../../sites';

/** What the plan editor changes on a site: the image calibration or the north direction. */
export type SitePlanChange = { planCalibration: PlanCalibration } | { northAzimuthDeg: number };

/** Changes the plan's frame on top of the site's `version` (If-Match). */
export function updateSitePlan({
  siteId,
  change,
  version,
}: {
  siteId: string;
  change: SitePlanChange;
  version: number;
}): Promise<SiteResponse & SiteVersionResponse> {
  return apiRequest(`/api/sites/${encodeURIComponent(siteId)}`, SiteResponseSchema.extend(SiteVersionResponseSchema.shape), {
    method: 'PATCH',
    body: change,
    headers: siteIfMatch(version),
  });
}

export function useUpdateSitePlan() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (args: { siteId: string; change: SitePlanChange }) =>
      sendSiteWrite(queryClient, args.siteId, (version) => updateSitePlan({ ...args, version })),
    onSuccess: (site, { siteId }) => {
      queryClient.setQueryData(getSiteQueryOptions(siteId).queryKey, site);
      return Promise.all([
        queryClient.invalidateQueries({ queryKey: getSiteQueryOptions(siteId).queryKey }),
        // Each job's as-built carries the site's north for its drawings.
        queryClient.invalidateQueries({ queryKey: jobKeys.details() }),
      ]);
    },
  });
}
