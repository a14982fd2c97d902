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

/** Adds a reference point to a site (no `pointId`) or changes one, on top of the site's `version`. */
export function saveReferencePoint({
  siteId,
  pointId,
  input,
  version,
}: {
  siteId: string;
  pointId?: string;
  input: CreateReferencePointInput;
  version: number;
}): Promise<ReferencePointResponse & SiteVersionResponse> {
  const base = `/api/sites/${encodeURIComponent(siteId)}/reference-points`;
  return apiRequest(pointId ? `${base}/${encodeURIComponent(pointId)}` : base, ReferencePointResponseSchema.extend(SiteVersionResponseSchema.shape), {
    method: pointId ? 'PATCH' : 'POST',
    body: input,
    headers: siteIfMatch(version),
  });
}

export function useSaveReferencePoint() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (args: { siteId: string; pointId?: string; input: CreateReferencePointInput }) =>
      sendSiteWrite(queryClient, args.siteId, (version) => saveReferencePoint({ ...args, version })),
    onSuccess: (_point, { siteId }) =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: getSiteQueryOptions(siteId).queryKey }),
        // Ties on every job of the site pick from these points.
        queryClient.invalidateQueries({ queryKey: jobKeys.details() }),
      ]),
  });
}
