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

/** A new point answers it with the site's versions. */
const CreatedPointResponseSchema = ReferencePointResponseSchema.extend(SiteVersionResponseSchema.shape);

/** Adds a reference point to a site (POST /api/sites/:siteId/reference-points) on top of the site's `version`. */
export function createReferencePoint({
  siteId,
  input,
  version,
}: {
  siteId: string;
  input: CreateReferencePointInput;
  version: number;
}): Promise<ReferencePointResponse & SiteVersionResponse> {
  return apiRequest(`/api/sites/${encodeURIComponent(siteId)}/reference-points`, CreatedPointResponseSchema, {
    method: 'POST',
    body: input,
    headers: siteIfMatch(version),
  });
}

export function useCreateReferencePoint() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ siteId, input }: { siteId: string; input: CreateReferencePointInput }) =>
      sendSiteWrite(queryClient, siteId, (version) => createReferencePoint({ siteId, input, version })),
    onSuccess: (_point, { siteId }) =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: getSiteQueryOptions(siteId).queryKey }),
        // Ties on every job of the site pick from these points.
        queryClient.invalidateQueries({ queryKey: jobKeys.details() }),
      ]),
  });
}
