import { useMutation } from '@tanstack/react-query';
import type { ResetPasswordInput } from '@domain/auth/auth.schema';

import { apiRequest } from '../../../lib/api-client';

/** Sets a new password from a reset link; the server ends every session of the account. */
export async function resetPassword(input: ResetPasswordInput): Promise<void> {
  await apiRequest('/api/auth/password-reset/confirm', undefined, { method: 'POST', body: input, auth: false });
}

export function useResetPassword() {
  return useMutation({ mutationFn: resetPassword });
}
