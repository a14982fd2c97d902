import type { JobStatus } from '@domain/jobs/job-rules';
import { JOB_STATUSES } from '@domain/jobs/job-rules';

/** Our own plain words for each status, as the crew and the office say them. */
export const JOB_STATUS_TEXT: Record<JobStatus, string> = {
  draft: 'Draft',
  in_progress: 'In progress',
  submitted: 'Submitted for review',
  ready_to_issue: 'Ready to issue',
  issued: 'Issued',
};

export { JOB_STATUSES };

export function isJobStatus(value: string): value is JobStatus {
  return (JOB_STATUSES as readonly string[]).includes(value);
}
