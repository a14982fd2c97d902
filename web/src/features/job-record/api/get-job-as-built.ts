import { queryOptions, useSuspenseQuery } from '@tanstack/react-query';
import { type JobAsBuiltResponse, JobAsBuiltResponseSchema } from '@domain/jobs/job.schema';
import type { z } from 'zod';

import { apiRequest } from '../../../lib/api-client';

import { jobKeys } from './job-keys';

export type { JobAsBuiltResponse };

// The response type keeps the as-built's and analysis' computation types; the schema describes the same JSON.
const AsBuiltAnswerSchema = JobAsBuiltResponseSchema as unknown as z.ZodType<JobAsBuiltResponse>;

/** The whole as-built of a job with its analysis and the ids the contract has no place for. */
export function getJobAsBuilt(jobId: string, { signal }: { signal?: AbortSignal } = {}): Promise<JobAsBuiltResponse> {
  return apiRequest(`/api/jobs/${encodeURIComponent(jobId)}/as-built`, AsBuiltAnswerSchema, { signal });
}

export function getJobAsBuiltQueryOptions(jobId: string) {
  return queryOptions({
    queryKey: jobKeys.asBuilt(jobId),
    queryFn: ({ signal }) => getJobAsBuilt(jobId, { signal }),
    // The crew records in bursts; the findings must follow each save, not a minute later.
    staleTime: 0,
  });
}

export function useJobAsBuilt(jobId: string) {
  return useSuspenseQuery(getJobAsBuiltQueryOptions(jobId));
}
