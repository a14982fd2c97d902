import type { LoaderFunctionArgs } from 'react-router';
import { Outlet } from 'react-router';

import { RouteErrorPage } from '../../../components/errors/route-error-page';
import { RequireSession } from '../../../features/auth/components/require-session';
import { requireUser } from '../../../features/auth/utils/require-user';

export const clientLoader =
  () =>
  async ({ request }: LoaderFunctionArgs) => {
    await requireUser(request);
    return null;
  };

/** Everything under here needs a session: signed-out visitors go to sign-in and come back after. */
export default function ProtectedRoute() {
  return (
    <RequireSession>
      <Outlet />
    </RequireSession>
  );
}

export const ErrorBoundary = RouteErrorPage;
