import type { QueryClient } from '@tanstack/react-query';
import { useParams, type LoaderFunctionArgs } from 'react-router';
import { STAFF_ROLES } from '@domain/auth/roles';

import { RouteErrorPage } from '../../../components/errors/route-error-page';
import { requireRole } from '../../../features/auth/utils/require-user';
import { JobDrawings } from '../../../features/drawings/components/job-drawings';
import { getJobAsBuiltQueryOptions, useJobAsBuilt } from '../../../features/job-record/api/get-job-as-built';

export const clientLoader =
  (queryClient: QueryClient) =>
  async ({ request, params }: LoaderFunctionArgs) => {
    await requireRole(request, STAFF_ROLES);
    await queryClient.ensureQueryData(getJobAsBuiltQueryOptions(params.jobId ?? ''));
    return null;
  };

export default function JobDrawingsRoute() {
  const { jobId = '' } = useParams();
  const { data } = useJobAsBuilt(jobId);
  return <JobDrawings data={data} />;
}

export const ErrorBoundary = RouteErrorPage;
