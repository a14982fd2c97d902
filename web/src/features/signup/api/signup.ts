import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { SessionResponseSchema } from '@domain/auth/auth.schema';
import {
  type CreateSignupInput,
  SignupAcceptedResponseSchema,
  SignupMailResponseSchema,
  SignupStatusResponseSchema,
} from '@domain/signup/signup.schema';

import { apiRequest } from '../../../lib/api-client';
import { setSession, type Session } from '../../../lib/session';

/** Whether companies may sign up here, whether any company exists yet, and whether mail is captured locally. */
export function getSignupStatusQueryOptions() {
  return queryOptions({
    queryKey: ['signup', 'status'],
    queryFn: ({ signal }) => apiRequest('/api/signup/status', SignupStatusResponseSchema, { signal, auth: false }),
    staleTime: 30_000,
  });
}

export function useSignupStatus() {
  return useQuery(getSignupStatusQueryOptions());
}

export function useRequestSignup() {
  return useMutation({
    mutationFn: (input: CreateSignupInput) =>
      apiRequest('/api/signup', SignupAcceptedResponseSchema, { method: 'POST', body: input, auth: false }),
  });
}

/** With mail captured locally: the message sent for a sign-up request (polled until it has gone). */
export function useSignupMail(receipt: string | undefined, enabled: boolean) {
  return useQuery({
    queryKey: ['signup', 'mail', receipt],
    queryFn: ({ signal }) => apiRequest(`/api/signup/mail/${encodeURIComponent(receipt!)}`, SignupMailResponseSchema, { signal, auth: false }),
    enabled: enabled && receipt !== undefined,
    refetchInterval: (query) => (query.state.data?.status === 'queued' ? 1_000 : false),
  });
}

/** Follows the verification link: the server creates the company and its admin and signs the admin in. */
export async function verifySignup(token: string): Promise<Session> {
  const body = await apiRequest('/api/signup/verify', SessionResponseSchema, { method: 'POST', body: { token }, auth: false });
  return setSession(body);
}

export function useVerifySignup() {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: verifySignup, onSuccess: () => queryClient.clear() });
}
