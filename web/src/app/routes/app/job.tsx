import type { QueryClient } from '@tanstack/react-query';
import { useParams, type LoaderFunctionArgs } from 'react-router';
import { STAFF_ROLES } from '@domain/auth/roles';

import { RouteErrorPage } from '../../../components/errors/route-error-page';
import { requireRole } from '../../../features/auth/utils/require-user';
import { getJobAsBuiltQueryOptions, useJobAsBuilt } from '../../../features/job-record/api/get-job-as-built';
import { JobWorkspace } from '../../../features/jobs/components/job-workspace';
import { JobWriterProvider } from '../../../features/jobs/hooks/job-writer';
import { useSessionUser } from '../../../lib/session';

export const clientLoader =
  (queryClient: QueryClient) =>
  async ({ request, params }: LoaderFunctionArgs) => {
    await requireRole(request, STAFF_ROLES);
    await queryClient.ensureQueryData(getJobAsBuiltQueryOptions(params.jobId ?? ''));
    return null;
  };

export default function JobRoute() {
  const { jobId = '' } = useParams();
  const user = useSessionUser();
  const { data } = useJobAsBuilt(jobId);
  if (!user) return null;
  return (
    <JobWriterProvider jobId={jobId}>
      <JobWorkspace data={data} actor={user} />
    </JobWriterProvider>
  );
}

export const ErrorBoundary = RouteErrorPage;
