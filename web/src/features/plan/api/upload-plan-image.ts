import { useMutation, useQueryClient } from '@tanstack/react-query';
import { type PlanImageUploadResponse, PlanImageUploadResponseSchema, SiteVersionResponseSchema } from '@domain/sites/site.schema';

import { apiRequest } from '../../../lib/api-client';
import { jobKeys } from '../../job-record';
import { getSiteQueryOptions } from '../../sites';
import { sendSiteWrite, siteIfMatch, type SiteVersionResponse } from '../../sites';

/** The image types the API takes for a site plan. */
export const PLAN_IMAGE_TYPES = ['image/jpeg', 'image/png', 'image/webp'] as const;

/** Puts `file` as the site's plan image on top of the site's `version` (replacing one also clears the calibration). */
export function uploadPlanImage({ siteId, file, version }: { siteId: string; file: File; version: number }): Promise<PlanImageUploadResponse & SiteVersionResponse> {
  const form = new FormData();
  form.append('file', file);
  return apiRequest(`/api/sites/${encodeURIComponent(siteId)}/plan-image`, PlanImageUploadResponseSchema.extend(SiteVersionResponseSchema.shape), {
    method: 'PUT',
    body: form,
    headers: siteIfMatch(version),
    timeoutMs: 120_000,
  });
}

export function useUploadPlanImage() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (args: { siteId: string; file: File }) => sendSiteWrite(queryClient, args.siteId, (version) => uploadPlanImage({ ...args, version })),
    onSuccess: (site, { siteId }) => {
      queryClient.setQueryData(getSiteQueryOptions(siteId).queryKey, site);
      return Promise.all([
        queryClient.invalidateQueries({ queryKey: getSiteQueryOptions(siteId).queryKey }),
        queryClient.invalidateQueries({ queryKey: jobKeys.details() }),
      ]);
    },
  });
}
