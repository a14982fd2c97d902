import { useMutation, useQueryClient } from '@tanstack/react-query';
import { type InvitationResponse, InvitationResponseSchema } from '@domain/auth/auth.schema';
import type { InviteHomeownerInput } from '@domain/sites/homeowner-invitation.schema';

import { apiRequest } from '../../../lib/api-client';
import { getInvitationsQueryOptions } from '../../users';

/** E-mails a portal invitation; the site is linked to the account when it is accepted. */
export function inviteHomeowner({ siteId, input }: { siteId: string; input: InviteHomeownerInput }): Promise<InvitationResponse> {
  return apiRequest(`/api/sites/${encodeURIComponent(siteId)}/homeowner-invitations`, InvitationResponseSchema, { method: 'POST', body: input });
}

export function useInviteHomeowner() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: inviteHomeowner,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: getInvitationsQueryOptions().queryKey }),
  });
}
