import { queryOptions, useQuery } from '@tanstack/react-query';
import { type SignupMailResponse, SignupMailResponseSchema } from '@domain/signup/signup.schema';

import { apiRequest } from '../../../lib/api-client';

/** With mail captured locally: the message sent for a sign-up request (GET /api/signup/mail/:receipt). */
export function getSignupMail(receipt: string, { signal }: { signal?: AbortSignal } = {}): Promise<SignupMailResponse> {
  return apiRequest(`/api/signup/mail/${encodeURIComponent(receipt)}`, SignupMailResponseSchema, { signal, auth: false });
}

export function getSignupMailQueryOptions(receipt: string) {
  return queryOptions({
    queryKey: ['signup', 'mail', receipt],
    queryFn: ({ signal }) => getSignupMail(receipt, { signal }),
    // Polled until the message has gone.
    refetchInterval: (query) => (query.state.data?.status === 'queued' ? 1_000 : false),
  });
}

export function useSignupMail(receipt: string | undefined, enabled: boolean) {
  return useQuery({ ...getSignupMailQueryOptions(receipt ?? ''), enabled: enabled && receipt !== undefined });
}
