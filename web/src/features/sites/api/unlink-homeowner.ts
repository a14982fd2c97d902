import { useMutation, useQueryClient } from '@tanstack/react-query';

import { apiRequest } from '../../../lib/api-client';

import { getSiteQueryOptions } from './get-site';

/** Takes the site out of a homeowner's portal (204, no body). */
export function unlinkHomeowner({ siteId, userId }: { siteId: string; userId: string }): Promise<void> {
  return apiRequest(`/api/sites/${encodeURIComponent(siteId)}/homeowners/${encodeURIComponent(userId)}`, undefined, { method: 'DELETE' }).then(() => undefined);
}

export function useUnlinkHomeowner() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: unlinkHomeowner,
    onSuccess: (_result, { siteId }) => queryClient.invalidateQueries({ queryKey: getSiteQueryOptions(siteId).queryKey }),
  });
}
