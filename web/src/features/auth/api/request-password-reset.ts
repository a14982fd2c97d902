import { useMutation } from '@tanstack/react-query';
import { z } from 'zod';
import type { RequestPasswordResetInput } from '@domain/auth/auth.schema';

import { apiRequest } from '../../../lib/api-client';

const RequestPasswordResetResponseSchema = z.object({ message: z.string() });

/** The server answers the same whether or not the address has an account. */
export function requestPasswordReset(input: RequestPasswordResetInput) {
  return apiRequest('/api/auth/password-reset', RequestPasswordResetResponseSchema, {
    method: 'POST',
    body: input,
    auth: false,
  });
}

export function useRequestPasswordReset() {
  return useMutation({ mutationFn: requestPasswordReset });
}
