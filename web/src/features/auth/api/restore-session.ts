import { isApiError, refreshSession } from '../../../lib/api-client';
import { readRememberedUser } from '../../../lib/offline-user';
import { getSessionState, getSessionUser, startOfflineSession, type SessionUser } from '../../../lib/session';

/**
 * After a reload the access token is gone (it lives in memory only); the refresh cookie may still
 * hold a session. Asks the server once per page load; later calls answer from memory.
 *
 * With no connection, the person last signed in on this device carries on offline (their cached jobs
 * and queued changes; lib/offline-user.ts). Throws `ApiError` (status 0) only when the server cannot
 * be reached and nobody was signed in here before.
 */
export async function restoreSession(): Promise<SessionUser | undefined> {
  if (getSessionState().status === 'unknown') {
    try {
      await refreshSession();
    } catch (error) {
      const remembered = readRememberedUser();
      if (!isApiError(error) || error.status !== 0 || !remembered) throw error;
      if (getSessionState().status === 'unknown') startOfflineSession(remembered);
    }
  }
  return getSessionUser();
}
