import { useEffect } from 'react';

import { refreshSession } from '../../../lib/api-client';
import { useSessionState } from '../../../lib/session';

// Refresh this long before the access token expires, so a request never goes out with a stale one…
const LEAD_MS = 60_000;
// …but never more often than this (short-lived tokens in tests and development).
const MIN_DELAY_MS = 5_000;
// After a failed attempt (no signal on site), try again this much later.
const RETRY_MS = 30_000;

/**
 * Keeps the access token fresh while someone is signed in: refreshes shortly before it expires. A
 * request that still meets a 401 refreshes on its own (api-client); this only saves that round trip.
 */
export function useSessionKeepAlive(): void {
  const state = useSessionState();
  const expiresAt = state.status === 'signed-in' ? state.session.expiresAt : undefined;

  useEffect(() => {
    if (expiresAt === undefined) return;
    let timer: ReturnType<typeof setTimeout>;
    const schedule = (delay: number) => {
      timer = setTimeout(() => {
        // Success publishes a new session, which re-runs this effect with the new expiry.
        refreshSession().catch(() => schedule(RETRY_MS));
      }, delay);
    };
    const lifetime = expiresAt - Date.now();
    schedule(Math.max(MIN_DELAY_MS, lifetime - Math.min(LEAD_MS, lifetime / 5)));
    return () => clearTimeout(timer);
  }, [expiresAt]);
}
