import { useEffect, type ReactNode } from 'react';
import { useLocation } from 'react-router';

import { paths } from '../../../config/paths';
import { pageLoad } from '../../../lib/page-load';
import { useSessionState } from '../../../lib/session';
import { currentPathOf } from '../utils/safe-next-path';

/**
 * Shows the signed-in area only while there is a session. When the session ends under the user (a
 * refresh was refused after a 401) it goes to sign-in, which says so, and comes back here afterwards;
 * after signing out it goes to sign-in without a way back. The sign-in page is a page of its own
 * (web/sign-in.html): a full page load, not a route of this router.
 */
export function RequireSession({ children }: { children: ReactNode }) {
  const state = useSessionState();
  const location = useLocation();
  const signedIn = state.status === 'signed-in';
  const signedOut = state.status === 'signed-out' && state.reason === 'signed-out';
  const expired = state.status === 'signed-out' && state.reason === 'expired';
  const next = signedOut ? undefined : currentPathOf(location);
  const href = signedIn ? undefined : paths.signIn.getHref(next, { expired });
  useEffect(() => {
    if (href) pageLoad.replace(href);
  }, [href]);
  return signedIn ? children : null;
}
