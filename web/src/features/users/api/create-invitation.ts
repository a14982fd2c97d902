import { useMutation, useQueryClient } from '@tanstack/react-query';
import { type CreateInvitationInput, type InvitationResponse, InvitationResponseSchema } from '@domain/auth/auth.schema';

import { apiRequest } from '../../../lib/api-client';

import { getInvitationsQueryOptions } from './get-invitations';

/** Creates the invitation and e-mails its link. */
export function createInvitation(input: CreateInvitationInput): Promise<InvitationResponse> {
  return apiRequest('/api/invitations', InvitationResponseSchema, { method: 'POST', body: input });
}

export function useCreateInvitation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createInvitation,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: getInvitationsQueryOptions().queryKey }),
  });
}
