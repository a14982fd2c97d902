import { useMutation } from '@tanstack/react-query';
import { type CreateSignupInput, type SignupAcceptedResponse, SignupAcceptedResponseSchema } from '@domain/signup/signup.schema';

import { apiRequest } from '../../../lib/api-client';

/** Asks for a company account (POST /api/signup): the server mails a verification link. */
export function requestSignup(input: CreateSignupInput): Promise<SignupAcceptedResponse> {
  return apiRequest('/api/signup', SignupAcceptedResponseSchema, { method: 'POST', body: input, auth: false });
}

export function useRequestSignup() {
  return useMutation({ mutationFn: requestSignup });
}
