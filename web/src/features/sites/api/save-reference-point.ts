import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreateReferencePointInput, ReferencePointResponse } from '@domain/sites/site.schema';

import { apiRequest } from '../../../lib/api-client';
import { responseOf } from '../../jobs/api/response';

import { getSiteQueryOptions } from './get-site';

/** Adds a reference point to a site (no `pointId`) or changes one. */
export function saveReferencePoint({
  siteId,
  pointId,
  input,
}: {
  siteId: string;
  pointId?: string;
  input: CreateReferencePointInput;
}): Promise<ReferencePointResponse> {
  const base = `/api/sites/${encodeURIComponent(siteId)}/reference-points`;
  return apiRequest(pointId ? `${base}/${encodeURIComponent(pointId)}` : base, responseOf<ReferencePointResponse>(), {
    method: pointId ? 'PATCH' : 'POST',
    body: input,
  });
}

export function useSaveReferencePoint() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: saveReferencePoint,
    onSuccess: (_point, { siteId }) =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: getSiteQueryOptions(siteId).queryKey }),
        // Ties on every job of the site pick from these points.
        queryClient.invalidateQueries({ queryKey: ['jobs', 'detail'] }),
      ]),
  });
}
