import { apiRequest } from '../../../lib/api-client';
import { responseOf } from '../../../lib/response';

/** The job's version now: asked before each upload and photo change, so a stale screen costs no wasted upload. */
export async function getJobVersion(jobId: string): Promise<number> {
  const job = await apiRequest(`/api/jobs/${encodeURIComponent(jobId)}`, responseOf<{ version: number }>());
  return job.version;
}
