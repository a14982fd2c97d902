import { queryOptions, useSuspenseQuery } from '@tanstack/react-query';
import type { JobAsBuiltResponse } from '@domain/jobs/job.schema';

import { apiRequest } from '../../../lib/api-client';

import { responseOf } from '../../../lib/response';

export type { JobAsBuiltResponse };

/** The whole as-built of a job with its analysis and the ids the contract has no place for. */
export function getJobAsBuilt(jobId: string, { signal }: { signal?: AbortSignal } = {}): Promise<JobAsBuiltResponse> {
  return apiRequest(`/api/jobs/${encodeURIComponent(jobId)}/as-built`, responseOf<JobAsBuiltResponse>(), { signal });
}

export function getJobAsBuiltQueryOptions(jobId: string) {
  return queryOptions({
    queryKey: ['jobs', 'detail', jobId, 'as-built'],
    queryFn: ({ signal }) => getJobAsBuilt(jobId, { signal }),
    // The crew records in bursts; the findings must follow each save, not a minute later.
    staleTime: 0,
  });
}

export function useJobAsBuilt(jobId: string) {
  return useSuspenseQuery(getJobAsBuiltQueryOptions(jobId));
}
