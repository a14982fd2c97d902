import { useMutation, useQueryClient } from '@tanstack/react-query';

import { apiRequest } from '../../../lib/api-client';

import { getSiteQueryOptions } from './get-site';

/** Deletes a reference point; the API refuses (409 IN_USE) while items are tied to it. */
export function deleteReferencePoint({ siteId, pointId }: { siteId: string; pointId: string }): Promise<void> {
  return apiRequest(`/api/sites/${encodeURIComponent(siteId)}/reference-points/${encodeURIComponent(pointId)}`, undefined, {
    method: 'DELETE',
  }).then(() => undefined);
}

export function useDeleteReferencePoint() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: deleteReferencePoint,
    onSuccess: (_result, { siteId }) =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: getSiteQueryOptions(siteId).queryKey }),
        queryClient.invalidateQueries({ queryKey: ['jobs', 'detail'] }),
      ]),
  });
}
