import { useMutation, useQueryClient } from '@tanstack/react-query';
import { type InvitationResponse, InvitationResponseSchema } from '@domain/auth/auth.schema';

import { apiRequest } from '../../../lib/api-client';

import { getInvitationsQueryOptions } from './get-invitations';

/** Queues the invitation e-mail again with a new link; the link in any earlier e-mail stops working. */
export function resendInvitation(id: string): Promise<InvitationResponse> {
  return apiRequest(`/api/invitations/${encodeURIComponent(id)}/resend`, InvitationResponseSchema, { method: 'POST' });
}

export function useResendInvitation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: resendInvitation,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: getInvitationsQueryOptions().queryKey }),
  });
}
