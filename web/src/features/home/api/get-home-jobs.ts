import type { JobStatus } from '@domain/jobs/job-rules';

import { getJobsQueryOptions, useJobs, type JobListParams } from '../../jobs';
import { OPEN_JOB_STATUSES } from '../utils/next-step';

/**
 * Today (crew lead, technician): every job the caller leads or is on that is not issued yet, from the
 * jobs list (`GET /api/jobs?status=…&mine=true`), so the cache is shared with the Jobs page.
 */
export const TODAY_PARAMS: JobListParams = { q: '', status: OPEN_JOB_STATUSES, sort: '-updatedAt', page: 1, mine: true };

/** The office's queue for one status: the whole company's jobs, the one waiting longest first. */
export function queueParams(status: JobStatus): JobListParams {
  return { q: '', status: [status], sort: 'updatedAt', page: 1, mine: false };
}

export const getTodayQueryOptions = () => getJobsQueryOptions(TODAY_PARAMS);
export const useTodayJobs = () => useJobs(TODAY_PARAMS);

export const getQueueQueryOptions = (status: JobStatus) => getJobsQueryOptions(queueParams(status));
export const useQueueJobs = (status: JobStatus) => useJobs(queueParams(status));
