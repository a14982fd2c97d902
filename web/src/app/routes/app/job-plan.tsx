import type { QueryClient } from '@tanstack/react-query';
import { useParams, type LoaderFunctionArgs } from 'react-router';
import { STAFF_ROLES } from '@domain/auth/roles';

import { RouteErrorPage } from '../../../components/errors/route-error-page';
import { requireRole } from '../../../features/auth/utils/require-user';
import { getJobAsBuiltQueryOptions, useJobAsBuilt } from '../../../features/job-record/api/get-job-as-built';
import { JobWriterProvider } from '../../../features/jobs/hooks/job-writer';
import { PlanEditor } from '../../../features/plan/components/plan-editor';
import { getSiteQueryOptions, useSite } from '../../../features/sites/api/get-site';
import { useSessionUser } from '../../../lib/session';

export const clientLoader =
  (queryClient: QueryClient) =>
  async ({ request, params }: LoaderFunctionArgs) => {
    await requireRole(request, STAFF_ROLES);
    const data = await queryClient.ensureQueryData(getJobAsBuiltQueryOptions(params.jobId ?? ''));
    await queryClient.ensureQueryData(getSiteQueryOptions(data.job.site.id));
    return null;
  };

export default function JobPlanRoute() {
  const { jobId = '' } = useParams();
  const user = useSessionUser();
  const { data } = useJobAsBuilt(jobId);
  const { data: site } = useSite(data.job.site.id);
  if (!user) return null;
  return (
    <JobWriterProvider jobId={jobId}>
      <PlanEditor data={data} site={site} actor={user} />
    </JobWriterProvider>
  );
}

export const ErrorBoundary = RouteErrorPage;
