import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { PlanCalibration, SiteResponse } from '@domain/sites/site.schema';

import { apiRequest } from '../../../lib/api-client';
import { responseOf } from '../../jobs/api/response';
import { getSiteQueryOptions } from '../../sites/api/get-site';

/** What the plan editor changes on a site: the image calibration or the north direction. */
export type SitePlanChange = { planCalibration: PlanCalibration } | { northAzimuthDeg: number };

export function updateSitePlan({ siteId, change }: { siteId: string; change: SitePlanChange }): Promise<SiteResponse> {
  return apiRequest(`/api/sites/${encodeURIComponent(siteId)}`, responseOf<SiteResponse>(), { method: 'PATCH', body: change });
}

export function useUpdateSitePlan() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateSitePlan,
    onSuccess: (site, { siteId }) => {
      queryClient.setQueryData(getSiteQueryOptions(siteId).queryKey, site);
      return Promise.all([
        queryClient.invalidateQueries({ queryKey: getSiteQueryOptions(siteId).queryKey }),
        // Each job's as-built carries the site's north for its drawings.
        queryClient.invalidateQueries({ queryKey: ['jobs', 'detail'] }),
      ]);
    },
  });
}
