import { JobResponseSchema } from '@domain/jobs/job.schema';

import { apiRequest } from '../../../lib/api-client';

/** The job's version now: asked before each upload and photo change, so a stale screen costs no wasted upload. */
export async function getJobVersion(jobId: string): Promise<number> {
  const job = await apiRequest(`/api/jobs/${encodeURIComponent(jobId)}`, JobResponseSchema);
  return job.version;
}
