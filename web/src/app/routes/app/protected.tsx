import { lazy, Suspense } from 'react';
import type { LoaderFunctionArgs } from 'react-router';
import { Outlet } from 'react-router';

import { RouteErrorPage } from '../../../components/errors/route-error-page';
import { RequireSession } from '../../../features/auth/components/require-session';
import { requireUser } from '../../../features/auth/utils/require-user';

// Photos queued before a reload go out again as soon as someone is signed in, on any page. The queue
// (IndexedDB store, upload code) is its own chunk, loaded right after the first page rather than with it.
// Changes to jobs made with no signal go out the same way, on any page (issue 17).
const JobWritesRunner = lazy(() =>
  import('../../../features/jobs/hooks/use-job-writes-runner').then(({ useJobWritesRunner }) => ({
    default: function RunJobWrites() {
      useJobWritesRunner();
      return null;
    },
  })),
);
const UploadQueueRunner = lazy(() =>
  import('../../../features/photos/hooks/use-upload-queue').then(({ useUploadQueueRunner }) => ({
    default: function RunUploadQueue() {
      useUploadQueueRunner();
      return null;
    },
  })),
);

export const clientLoader =
  () =>
  async ({ request }: LoaderFunctionArgs) => {
    await requireUser(request);
    return null;
  };

/** Everything under here needs a session: signed-out visitors go to sign-in and come back after. */
export default function ProtectedRoute() {
  return (
    <>
      <Suspense fallback={null}>
        <UploadQueueRunner />
        <JobWritesRunner />
      </Suspense>
      <RequireSession>
        <Outlet />
      </RequireSession>
    </>
  );
}

export const ErrorBoundary = RouteErrorPage;
