import { data, redirectDocument } from 'react-router';
import type { Role } from '@domain/auth/roles';

import { paths } from '../../../config/paths';
import { getSessionState, type SessionUser } from '../../../lib/session';
import { restoreSession } from '../api/restore-session';

import { currentPathOf } from './safe-next-path';

/**
 * For route loaders of the signed-in area: the signed-in user, or a redirect to the sign-in page that
 * comes back to this address afterwards (a full page load: the sign-in page is not a route of the app,
 * web/sign-in.html), saying so when the session ended under the user.
 */
export async function requireUser(request: Request): Promise<SessionUser> {
  const user = await restoreSession();
  if (!user) {
    const state = getSessionState();
    const expired = state.status === 'signed-out' && state.reason === 'expired';
    throw redirectDocument(paths.signIn.getHref(currentPathOf(new URL(request.url)), { expired }));
  }
  return user;
}

/** As `requireUser`, and refuses (403) a user whose role may not open this page. */
export async function requireRole(request: Request, roles: readonly Role[]): Promise<SessionUser> {
  const user = await requireUser(request);
  if (!roles.includes(user.role)) {
    throw data(null, { status: 403, statusText: 'Your role does not give access to this page.' });
  }
  return user;
}
