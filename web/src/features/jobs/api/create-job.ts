import { useMutation, useQueryClient } from '@tanstack/react-query';
import { type CreateJobInput, type JobResponse, JobResponseSchema } from '@domain/jobs/job.schema';

import { apiRequest } from '../../../lib/api-client';

import { jobKeys } from '../../job-record';
import { siteKeys } from '../../sites';

export function createJob(input: CreateJobInput): Promise<JobResponse> {
  return apiRequest('/api/jobs', JobResponseSchema, { method: 'POST', body: input });
}

export function useCreateJob() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createJob,
    onSuccess: (_job, { siteId }) =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: jobKeys.lists() }),
        // The site lists its jobs.
        queryClient.invalidateQueries({ queryKey: siteKeys.detail(siteId) }),
      ]),
  });
}
