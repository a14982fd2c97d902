import type { LoaderFunctionArgs } from 'react-router';
import { Outlet } from 'react-router';

import { RouteErrorPage } from '../../../components/errors/route-error-page';
import { RequireSession } from '../../../features/auth/components/require-session';
import { requireUser } from '../../../features/auth/utils/require-user';
import { useUploadQueueRunner } from '../../../features/photos/hooks/use-upload-queue';

export const clientLoader =
  () =>
  async ({ request }: LoaderFunctionArgs) => {
    await requireUser(request);
    return null;
  };

/** Everything under here needs a session: signed-out visitors go to sign-in and come back after. */
export default function ProtectedRoute() {
  // Photos queued before a reload go out again as soon as someone is signed in, on any page.
  useUploadQueueRunner();
  return (
    <RequireSession>
      <Outlet />
    </RequireSession>
  );
}

export const ErrorBoundary = RouteErrorPage;
