import { useMutation, useQueryClient } from '@tanstack/react-query';
import { type SignInInput, SessionResponseSchema } from '@domain/auth/auth.schema';

import { apiRequest } from '../../../lib/api-client';
import { setSession, type Session } from '../../../lib/session';

export async function signIn(input: SignInInput): Promise<Session> {
  // Never refresh on a 401 here: a refused password is an answer, not an expired session.
  const body = await apiRequest('/api/auth/sign-in', SessionResponseSchema, { method: 'POST', body: input, auth: false });
  return setSession(body);
}

export function useSignIn() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: signIn,
    // Whatever was cached belonged to whoever used this tab before.
    onSuccess: () => queryClient.clear(),
  });
}
