import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { type JobListResponse, JobListResponseSchema, type JobSummaryResponse } from '@domain/jobs/job.schema';
import type { JobStatus } from '@domain/jobs/job-rules';

import { apiRequest } from '../../../lib/api-client';

import { jobKeys } from '../../job-record';

export type { JobListResponse, JobSummaryResponse };

export const JOBS_PAGE_SIZE = 25;

/** What the jobs list asks the server for; mirrors the page's query string. */
export type JobListParams = {
  q: string;
  status: JobStatus[];
  /** A field, `-field` for descending. */
  sort: string;
  page: number;
  /**
   * The `nextCursor` of the page before `page`, read with the same filters and sort: the page then starts
   * right after the last job seen, so jobs added or removed meanwhile neither repeat nor go missing.
   * Without it, the page is counted by number.
   */
  cursor?: string | undefined;
  mine: boolean;
};

/** The API's query string for `params` (empty values left out, stable order): the cursor, or else the page. */
export function jobListSearch(params: JobListParams): string {
  const search = new URLSearchParams();
  if (params.q.trim() !== '') search.set('q', params.q.trim());
  if (params.status.length > 0) search.set('status', params.status.join(','));
  search.set('sort', params.sort);
  if (params.cursor) search.set('cursor', params.cursor);
  else search.set('page', String(params.page));
  search.set('pageSize', String(JOBS_PAGE_SIZE));
  if (params.mine) search.set('mine', 'true');
  return search.toString();
}

export function getJobs(params: JobListParams, { signal }: { signal?: AbortSignal } = {}): Promise<JobListResponse> {
  return apiRequest(`/api/jobs?${jobListSearch(params)}`, JobListResponseSchema, { signal });
}

export function getJobsQueryOptions(params: JobListParams) {
  return queryOptions({
    queryKey: jobKeys.list(params),
    queryFn: ({ signal }) => getJobs(params, { signal }),
  });
}

export function useJobs(params: JobListParams) {
  return useQuery({ ...getJobsQueryOptions(params), placeholderData: keepPreviousData });
}
