import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreateJobInput, JobResponse } from '@domain/jobs/job.schema';

import { apiRequest } from '../../../lib/api-client';

import { responseOf } from '../../../lib/response';

export function createJob(input: CreateJobInput): Promise<JobResponse> {
  return apiRequest('/api/jobs', responseOf<JobResponse>(), { method: 'POST', body: input });
}

export function useCreateJob() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createJob,
    onSuccess: () =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: ['jobs', 'list'] }),
        queryClient.invalidateQueries({ queryKey: ['sites', 'detail'] }),
      ]),
  });
}
