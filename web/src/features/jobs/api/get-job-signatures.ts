import { queryOptions, useQuery } from '@tanstack/react-query';
import type { JobSignatureResponse } from '@domain/packet/signature.schema';

import { apiRequest } from '../../../lib/api-client';

import { responseOf } from '../../../lib/response';

export type { JobSignatureResponse };

/** The walkthrough signatures captured for the job's next revision (crew lead, homeowner). */
export function getJobSignatures(jobId: string, { signal }: { signal?: AbortSignal } = {}): Promise<JobSignatureResponse[]> {
  return apiRequest(`/api/jobs/${encodeURIComponent(jobId)}/signatures`, responseOf<JobSignatureResponse[]>(), { signal });
}

export function getJobSignaturesQueryOptions(jobId: string) {
  return queryOptions({
    queryKey: ['jobs', 'detail', jobId, 'signatures'],
    queryFn: ({ signal }) => getJobSignatures(jobId, { signal }),
  });
}

export function useJobSignatures(jobId: string) {
  return useQuery(getJobSignaturesQueryOptions(jobId));
}
