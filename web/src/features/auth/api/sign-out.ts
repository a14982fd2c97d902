import { useMutation, useQueryClient } from '@tanstack/react-query';

import { apiRequest } from '../../../lib/api-client';
import { clearSession } from '../../../lib/session';
import { announceSignedOut } from '../../../lib/session-sync';

/** Ends the session on the server (the cookie is cleared there) and forgets it here, even if offline. */
export async function signOut(): Promise<void> {
  try {
    await apiRequest('/api/auth/sign-out', undefined, { method: 'POST', auth: false });
  } finally {
    clearSession('signed-out');
    // The server ended the cookie every tab shares: the other tabs are signed out too.
    announceSignedOut();
  }
}

export function useSignOut() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: signOut,
    // Nothing of this company's data stays in the tab, whether or not the server answered.
    onSettled: () => queryClient.clear(),
  });
}
