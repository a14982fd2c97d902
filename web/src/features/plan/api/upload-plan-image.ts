import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { SiteResponse } from '@domain/sites/site.schema';

import { apiRequest } from '../../../lib/api-client';
import { responseOf } from '../../jobs/api/response';
import { getSiteQueryOptions } from '../../sites/api/get-site';

/** The image types the API takes for a site plan. */
export const PLAN_IMAGE_TYPES = ['image/jpeg', 'image/png', 'image/webp'] as const;

/** Puts `file` as the site's plan image (replacing one, which also clears the calibration). */
export function uploadPlanImage({ siteId, file }: { siteId: string; file: File }): Promise<SiteResponse> {
  const form = new FormData();
  form.append('file', file);
  return apiRequest(`/api/sites/${encodeURIComponent(siteId)}/plan-image`, responseOf<SiteResponse>(), {
    method: 'PUT',
    body: form,
    timeoutMs: 120_000,
  });
}

export function useUploadPlanImage() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: uploadPlanImage,
    onSuccess: (site, { siteId }) => {
      queryClient.setQueryData(getSiteQueryOptions(siteId).queryKey, site);
      return queryClient.invalidateQueries({ queryKey: getSiteQueryOptions(siteId).queryKey });
    },
  });
}
