import { useMutation, useQueryClient } from '@tanstack/react-query';

import { apiRequest } from '../../../lib/api-client';

import { getInvitationsQueryOptions } from './get-invitations';

/** Withdraws an invitation: its link stops working. */
export async function revokeInvitation(id: string): Promise<void> {
  await apiRequest(`/api/invitations/${encodeURIComponent(id)}`, undefined, { method: 'DELETE' });
}

export function useRevokeInvitation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: revokeInvitation,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: getInvitationsQueryOptions().queryKey }),
  });
}
