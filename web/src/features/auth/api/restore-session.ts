import { refreshSession } from '../../../lib/api-client';
import { getSessionState, getSessionUser, type SessionUser } from '../../../lib/session';

/**
 * After a reload the access token is gone (it lives in memory only); the refresh cookie may still
 * hold a session. Asks the server once per page load; later calls answer from memory.
 *
 * Throws `ApiError` (status 0) only when the server cannot be reached.
 */
export async function restoreSession(): Promise<SessionUser | undefined> {
  if (getSessionState().status === 'unknown') await refreshSession();
  return getSessionUser();
}
