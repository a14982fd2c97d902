import { queryOptions, useQuery } from '@tanstack/react-query';
import { type JobSignatureResponse, JobSignatureResponseSchema } from '@domain/packet/signature.schema';
import { z } from 'zod';

import { apiRequest } from '../../../lib/api-client';

import { jobKeys } from '../../job-record';

export type { JobSignatureResponse };

/** The walkthrough signatures captured for the job's next revision (crew lead, homeowner). */
export function getJobSignatures(jobId: string, { signal }: { signal?: AbortSignal } = {}): Promise<JobSignatureResponse[]> {
  return apiRequest(`/api/jobs/${encodeURIComponent(jobId)}/signatures`, z.array(JobSignatureResponseSchema), { signal });
}

export function getJobSignaturesQueryOptions(jobId: string) {
  return queryOptions({
    queryKey: jobKeys.signatures(jobId),
    queryFn: ({ signal }) => getJobSignatures(jobId, { signal }),
  });
}

export function useJobSignatures(jobId: string) {
  return useQuery(getJobSignaturesQueryOptions(jobId));
}
