import type { QueryClient } from '@tanstack/react-query';
import { lazy, Suspense } from 'react';
import { Navigate, redirect } from 'react-router';

import { RouteErrorPage } from '../../../components/errors/route-error-page';
import { paths } from '../../../config/paths';
import { getFailedDeliveriesQueryOptions } from '../../../features/delivery/api/get-failed-deliveries';
import { getQueueQueryOptions, getTodayQueryOptions } from '../../../features/home/api/get-home-jobs';
import { Today } from '../../../features/home/components/today';
import { getSessionUser, useSessionUser } from '../../../lib/session';

// The office's work queue (with the delivery feature's resend dialog and its form code) is a chunk of
// its own: a crew lead opening Today on a weak signal does not download it.
const loadWorkQueue = () => import('../../../features/home/components/work-queue');
const WorkQueue = lazy(() => loadWorkQueue().then(({ WorkQueue }) => ({ default: WorkQueue })));

export const clientLoader = (queryClient: QueryClient) => () => {
  const role = getSessionUser()?.role;
  // A homeowner's home is their property.
  if (role === 'homeowner') throw redirect(paths.portal.getHref());
  // Started here, not awaited: the page (its heading and what it is for) draws at once on a weak
  // signal and each list shows its own loading state until it arrives. prefetchQuery never throws: a
  // list that fails to load says so on the page.
  if (role === 'admin' || role === 'office') {
    void loadWorkQueue();
    void queryClient.prefetchQuery(getQueueQueryOptions('submitted'));
    void queryClient.prefetchQuery(getQueueQueryOptions('ready_to_issue'));
    void queryClient.prefetchQuery(getFailedDeliveriesQueryOptions());
  } else if (role === 'lead' || role === 'tech') {
    void queryClient.prefetchQuery(getTodayQueryOptions());
  }
  return null;
};

/**
 * Where signing in lands, by role: crew lead and technician on Today (their jobs, the work in hand
 * first), office and admin on the work queue; a homeowner is sent on to their property. The server's
 * health has its own page, System status.
 */
export default function HomeRoute() {
  const user = useSessionUser();
  if (!user) return null;
  // The loader may run before the session is known (a reload): send a homeowner on here too, before any
  // staff list is asked for.
  if (user.role === 'homeowner') return <Navigate to={paths.portal.getHref()} replace />;
  if (user.role === 'admin' || user.role === 'office') {
    return (
      <Suspense fallback={null}>
        <WorkQueue role={user.role} />
      </Suspense>
    );
  }
  return <Today role={user.role} />;
}

export const ErrorBoundary = RouteErrorPage;
