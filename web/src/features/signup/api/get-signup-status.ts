import { queryOptions, useQuery } from '@tanstack/react-query';
import { type SignupStatusResponse, SignupStatusResponseSchema } from '@domain/signup/signup.schema';

import { apiRequest } from '../../../lib/api-client';

/**
 * Whether companies may sign up here, whether any company exists yet, and whether mail is captured
 * locally (GET /api/signup/status, without a session).
 */
export function getSignupStatus({ signal }: { signal?: AbortSignal } = {}): Promise<SignupStatusResponse> {
  return apiRequest('/api/signup/status', SignupStatusResponseSchema, { signal, auth: false });
}

export function getSignupStatusQueryOptions() {
  return queryOptions({
    queryKey: ['signup', 'status'],
    queryFn: ({ signal }) => getSignupStatus({ signal }),
    staleTime: 30_000,
  });
}

export function useSignupStatus() {
  return useQuery(getSignupStatusQueryOptions());
}
