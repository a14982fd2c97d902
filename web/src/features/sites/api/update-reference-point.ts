import { useMutation, useQueryClient } from '@tanstack/react-query';
import {
  type CreateReferencePointInput,
  type ReferencePointResponse,
  ReferencePointResponseSchema,
  SiteVersionResponseSchema,
} from '@domain/sites/site.schema';

import { apiRequest } from '../../../lib/api-client';
import { jobKeys } from '../../job-record';

import { getSiteQueryOptions } from './get-site';
import { sendSiteWrite, siteIfMatch, type SiteVersionResponse } from './site-write';

/** A changed point answers it with the site's versions. */
const UpdatedPointResponseSchema = ReferencePointResponseSchema.extend(SiteVersionResponseSchema.shape);

/** Changes a reference point of a site (PATCH /api/sites/:siteId/reference-points/:pointId) on top of the site's `version`. */
export function updateReferencePoint({
  siteId,
  pointId,
  input,
  version,
}: {
  siteId: string;
  pointId: string;
  input: CreateReferencePointInput;
  version: number;
}): Promise<ReferencePointResponse & SiteVersionResponse> {
  return apiRequest(
    `/api/sites/${encodeURIComponent(siteId)}/reference-points/${encodeURIComponent(pointId)}`,
    UpdatedPointResponseSchema,
    { method: 'PATCH', body: input, headers: siteIfMatch(version) },
  );
}

export function useUpdateReferencePoint() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ siteId, pointId, input }: { siteId: string; pointId: string; input: CreateReferencePointInput }) =>
      sendSiteWrite(queryClient, siteId, (version) => updateReferencePoint({ siteId, pointId, input, version })),
    onSuccess: (_point, { siteId }) =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: getSiteQueryOptions(siteId).queryKey }),
        // Ties on every job of the site pick from these points.
        queryClient.invalidateQueries({ queryKey: jobKeys.details() }),
      ]),
  });
}
