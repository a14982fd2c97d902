import { data, redirect } from 'react-router';
import type { Role } from '@domain/auth/roles';

import { paths } from '../../../config/paths';
import type { SessionUser } from '../../../lib/session';
import { restoreSession } from '../api/restore-session';

import { currentPathOf } from './safe-next-path';

/**
 * For route loaders of the signed-in area: the signed-in user, or a redirect to the sign-in page that
 * comes back to this address afterwards.
 */
export async function requireUser(request: Request): Promise<SessionUser> {
  const user = await restoreSession();
  if (!user) throw redirect(paths.signIn.getHref(currentPathOf(new URL(request.url))));
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
