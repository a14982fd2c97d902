import { Spinner } from '@fluentui/react-components';
import type { QueryClient } from '@tanstack/react-query';
import { useCallback, useEffect, useRef } from 'react';
import { useSearchParams, type LoaderFunctionArgs } from 'react-router';
import { STAFF_ROLES } from '@domain/auth/roles';

import { RouteErrorPage } from '../../../components/errors/route-error-page';
import { PageHeader } from '../../../components/page-header';
import { Pager } from '../../../components/pager';
import { requireRole } from '../../../features/auth/utils/require-user';
import { getJobsQueryOptions, JOBS_PAGE_SIZE, useJobs, type JobListParams } from '../../../features/jobs/api/get-jobs';
import { CreateJobDialog } from '../../../features/jobs/components/create-job-dialog';
import { JobsFilters } from '../../../features/jobs/components/jobs-filters';
import { JobsTable } from '../../../features/jobs/components/jobs-table';
import { useJobPageCursors } from '../../../features/jobs/hooks/use-job-page-cursors';
import { changeJobListParams, jobListAddressSearch, parseJobListParams } from '../../../features/jobs/utils/job-list-params';
import { useSessionUser } from '../../../lib/session';
import { useMediaQuery } from '../../../lib/use-media-query';

export const clientLoader =
  (queryClient: QueryClient) =>
  async ({ request }: LoaderFunctionArgs) => {
    const user = await requireRole(request, STAFF_ROLES);
    // Not awaited: a new search or page keeps the current rows (dimmed) instead of holding the
    // address back until the answer arrives, so the filters always act on what the address shows.
    void queryClient.prefetchQuery(getJobsQueryOptions(parseJobListParams(new URL(request.url).searchParams, user.role)));
    return null;
  };

export default function JobsRoute() {
  const user = useSessionUser();
  const isPhone = useMediaQuery('(max-width: 767.98px)');
  const [searchParams, setSearchParams] = useSearchParams();
  const role = user?.role ?? 'tech';
  const params = parseJobListParams(searchParams, role);
  const jobs = useJobs(params);
  const cursorFor = useJobPageCursors(params, jobs.data);
  const paramsKey = searchParams.toString();
  // The address changes in a transition, so a second change right after the first (a filter, then
  // "Next") must build on the first one's result, not on what is still on screen.
  const pendingSearch = useRef<string | undefined>(undefined);
  useEffect(() => {
    pendingSearch.current = undefined;
  }, [paramsKey]);

  const update = useCallback(
    (changes: Partial<JobListParams>) => {
      const base = new URLSearchParams(pendingSearch.current ?? paramsKey);
      const search = jobListAddressSearch(changeJobListParams(parseJobListParams(base, role), changes), role);
      pendingSearch.current = search;
      setSearchParams(new URLSearchParams(search));
    },
    [paramsKey, role, setSearchParams],
  );

  if (!user) return null;
  const isOffice = user.role === 'admin' || user.role === 'office';
  const isFiltered = params.q !== '' || params.status.length > 0;

  return (
    <>
      <PageHeader
        title="Jobs"
        description={
          params.mine
            ? 'Jobs you lead or are on the crew of. Open one to record what went in the ground.'
            : 'Every job of the company, newest change first.'
        }
        actions={isOffice ? <CreateJobDialog /> : undefined}
      />
      <JobsFilters params={params} onChange={update} showSort={isPhone} />
      {jobs.data ? (
        <>
          <JobsTable
            jobs={jobs.data.items}
            sort={params.sort}
            onSortChange={(sort) => update({ sort, page: 1 })}
            isPhone={isPhone}
            isStale={jobs.isPlaceholderData}
            emptyText={
              isFiltered
                ? 'No job matches this search. Clear the search or choose another status.'
                : params.mine
                  ? 'You are not on the crew of any job yet. The office assigns crews; "All jobs" shows the rest.'
                  : 'No jobs yet. The office creates a job from a site.'
            }
          />
          <Pager
            page={jobs.data.page}
            pageSize={JOBS_PAGE_SIZE}
            total={jobs.data.total}
            noun="jobs"
            onPageChange={(page) => update({ page, cursor: cursorFor(page) })}
          />
        </>
      ) : (
        <Spinner label="Loading jobs…" />
      )}
    </>
  );
}

export const ErrorBoundary = RouteErrorPage;
