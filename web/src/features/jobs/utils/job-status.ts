import type { JobStatus } from '@domain/jobs/job-rules';
import { JOB_STATUS_LABELS, JOB_STATUSES } from '@domain/jobs/job-rules';

/** Our own plain words for each status, as the crew and the office say them: the domain's one set. */
export const JOB_STATUS_TEXT: Record<JobStatus, string> = JOB_STATUS_LABELS;

export { JOB_STATUSES };

export function isJobStatus(value: string): value is JobStatus {
  return (JOB_STATUSES as readonly string[]).includes(value);
}
