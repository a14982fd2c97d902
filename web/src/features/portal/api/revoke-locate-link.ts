import { useMutation, useQueryClient } from '@tanstack/react-query';

import { apiRequest } from '../../../lib/api-client';

import { getLocateLinksQueryOptions } from './get-locate-links';

/** Revokes a locate link: it answers "no longer works" from then on. */
export async function revokeLocateLink({ id }: { id: string; siteId: string }): Promise<void> {
  await apiRequest(`/api/locate-links/${encodeURIComponent(id)}`, undefined, { method: 'DELETE' });
}

export function useRevokeLocateLink() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: revokeLocateLink,
    onSuccess: (_result, { siteId }) => queryClient.invalidateQueries({ queryKey: getLocateLinksQueryOptions(siteId).queryKey }),
  });
}
