import { useMutation, useQueryClient } from '@tanstack/react-query';
import { SessionResponseSchema } from '@domain/auth/auth.schema';

import { apiRequest } from '../../../lib/api-client';
import { setSession, type Session } from '../../../lib/session';

/** Follows the verification link (POST /api/signup/verify): the server creates the company and its admin and signs the admin in. */
export async function verifySignup(token: string): Promise<Session> {
  const body = await apiRequest('/api/signup/verify', SessionResponseSchema, { method: 'POST', body: { token }, auth: false });
  return setSession(body);
}

export function useVerifySignup() {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: verifySignup, onSuccess: () => queryClient.clear() });
}
