import type { ReactNode } from 'react';
import { Navigate, useLocation } from 'react-router';

import { paths } from '../../../config/paths';
import { useSessionState } from '../../../lib/session';
import { currentPathOf } from '../utils/safe-next-path';

/**
 * Shows the signed-in area only while there is a session. When the session ends under the user (a
 * refresh was refused after a 401) it goes to sign-in and comes back here afterwards; after signing
 * out it goes to sign-in without a way back.
 */
export function RequireSession({ children }: { children: ReactNode }) {
  const state = useSessionState();
  const location = useLocation();
  if (state.status === 'signed-in') return children;
  const next = state.status === 'signed-out' && state.reason === 'signed-out' ? undefined : currentPathOf(location);
  return <Navigate to={paths.signIn.getHref(next)} replace />;
}
