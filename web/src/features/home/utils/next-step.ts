import type { Role } from '@domain/auth/roles';
import type { JobStatus } from '@domain/jobs/job-rules';

/** The statuses a job the crew is on can be in before it is issued: what Today lists. */
export const OPEN_JOB_STATUSES: JobStatus[] = ['draft', 'in_progress', 'submitted', 'ready_to_issue'];

/** Today's order: the work in hand first, then what is about to start, then what waits on the office. */
const TODAY_ORDER: Record<JobStatus, number> = { in_progress: 0, draft: 1, submitted: 2, ready_to_issue: 3, issued: 4 };

type Orderable = { status: JobStatus; startDate: string | null; updatedAt: string };

/** In progress first; within a status the earliest start date first (undated last), then the latest touched. */
export function compareForToday(a: Orderable, b: Orderable): number {
  const byStatus = TODAY_ORDER[a.status] - TODAY_ORDER[b.status];
  if (byStatus !== 0) return byStatus;
  if (a.startDate !== b.startDate) {
    if (a.startDate === null) return 1;
    if (b.startDate === null) return -1;
    return a.startDate < b.startDate ? -1 : 1;
  }
  return b.updatedAt.localeCompare(a.updatedAt);
}

/**
 * The next thing to do on a job, for the person looking at it, from its status and their role (the
 * status machine in @domain/jobs/job-rules: the lead starts and submits, technicians add field data,
 * the office reviews and issues).
 */
export function nextStepFor(status: JobStatus, role: Role): string {
  switch (status) {
    case 'draft':
      return role === 'tech' ? 'Not started yet: your crew lead starts it on site' : 'Start the job when the crew is on site';
    case 'in_progress':
      return role === 'tech'
        ? 'Add depth readings, checks and photos before the trench is filled'
        : 'Record what went in the ground, then submit it for review';
    case 'submitted':
      return role === 'admin' || role === 'office'
        ? 'Review the record, then mark it ready to issue or send it back'
        : 'Nothing to do: the office is reviewing it';
    case 'ready_to_issue':
      return role === 'admin' || role === 'office'
        ? 'Issue the handover packet to the homeowner'
        : 'Nothing to do: the office issues the handover packet';
    case 'issued':
      return 'Done: the handover packet is issued';
  }
}
