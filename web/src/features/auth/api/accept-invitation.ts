import { useMutation, useQueryClient } from '@tanstack/react-query';
import { type AcceptInvitationInput, SessionResponseSchema } from '@domain/auth/auth.schema';

import { apiRequest } from '../../../lib/api-client';
import { setSession, type Session } from '../../../lib/session';

/** Sets name and password from an invitation link; the server signs the new user in at once. */
export async function acceptInvitation(input: AcceptInvitationInput): Promise<Session> {
  const body = await apiRequest('/api/auth/invitations/accept', SessionResponseSchema, {
    method: 'POST',
    body: input,
    auth: false,
  });
  return setSession(body);
}

export function useAcceptInvitation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: acceptInvitation,
    onSuccess: () => queryClient.clear(),
  });
}
