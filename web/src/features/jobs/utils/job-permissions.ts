import type { Role } from '@domain/auth/roles';
import type { JobResponse } from '@domain/jobs/job.schema';
import {
  canIssuePacket,
  canTransition,
  canWriteJob,
  JOB_TRANSITIONS,
  REQUESTABLE_STATUSES,
  type JobAccessFacts,
  type JobActor,
  type JobStatus,
} from '@domain/jobs/job-rules';

export function accessFacts(job: JobResponse): JobAccessFacts {
  return {
    status: job.status,
    crewLeadUserId: job.crewLead?.id ?? null,
    crewUserIds: job.technicians.map((person) => person.id),
  };
}

/** What the signed-in person may change on this job now (the same rules the API applies). */
export function jobPermissions(actor: { id: string; role: Role }, job: JobResponse) {
  const who: JobActor = { role: actor.role, userId: actor.id };
  const facts = accessFacts(job);
  return {
    canRecord: canWriteJob(who, facts, 'record').isAllowed,
    canAddField: canWriteJob(who, facts, 'field').isAllowed,
    canChangeDetails: canWriteJob(who, facts, 'details').isAllowed,
    canSign: canWriteJob(who, facts, 'signoff').isAllowed,
    canIssue: canIssuePacket(who, facts).isAllowed,
    // A crew lead may change the notes of a job they record (the API allows it as a record write).
    canChangeNotes: canWriteJob(who, facts, actor.role === 'lead' ? 'record' : 'details').isAllowed,
  };
}

/** A status the API lets a person ask for (`issued` comes from issuing a packet, `draft` never). */
export type RequestableStatus = (typeof REQUESTABLE_STATUSES)[number];

export type StatusAction = { to: RequestableStatus; label: string; needsComment: boolean; isPrimary: boolean };

function isRequestable(status: JobStatus): status is RequestableStatus {
  return (REQUESTABLE_STATUSES as readonly JobStatus[]).includes(status);
}

function labelOf(from: JobStatus, to: JobStatus): string {
  if (from === 'draft') return 'Start work';
  if (to === 'submitted') return 'Submit for review';
  if (to === 'ready_to_issue') return 'Mark ready to issue';
  if (from === 'issued') return 'Reopen for a new revision';
  return 'Send back to the crew';
}

/** The status moves this person may make from the job's status, as buttons. */
export function statusActions(actor: { id: string; role: Role }, job: JobResponse): StatusAction[] {
  const who: JobActor = { role: actor.role, userId: actor.id };
  const facts = accessFacts(job);
  return JOB_TRANSITIONS.flatMap((t) =>
    t.from === job.status &&
    isRequestable(t.to) &&
    // A placeholder comment: whether a comment is needed is asked in the dialog, not here.
    canTransition(who, facts, t.to, 'x').isAllowed
      ? [{ ...t, to: t.to }]
      : [],
  ).map((t) => ({
    to: t.to,
    label: labelOf(t.from, t.to),
    needsComment: t.isCommentRequired,
    isPrimary: !t.isCommentRequired,
  }));
}
