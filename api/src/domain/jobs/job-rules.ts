import type { Role } from '../auth/roles.js';

/** The lifecycle of a job's as-built. `issued` is reached only by issuing a handover packet. */
export const JOB_STATUSES = ['draft', 'in_progress', 'submitted', 'ready_to_issue', 'issued'] as const;
export type JobStatus = (typeof JOB_STATUSES)[number];

export const JOB_STATUS_LABELS: Record<JobStatus, string> = {
  draft: 'Draft',
  in_progress: 'In progress',
  submitted: 'Submitted for review',
  ready_to_issue: 'Ready to issue',
  issued: 'Issued',
};

/** Who a user is to one job: enough to decide every permission without the database. */
export interface JobActor {
  role: Role;
  userId: string;
}

export interface JobAccessFacts {
  status: JobStatus;
  crewLeadUserId: string | null;
  /** Users assigned to the job's crew (technicians and extra leads). */
  crewUserIds: readonly string[];
}

/**
 * What a write changes:
 * - `details`: the job itself (title, dates, crew, notes);
 * - `record`: the as-built (zones, equipment, runs, ties, routes, amplifier setup);
 * - `field`: what technicians add on site (depth readings, commissioning checks; later photos);
 * - `delete`: removing the whole job;
 * - `signoff`: the walkthrough signatures (crew lead, homeowner) on the job's next revision, captured on
 *   the lead's device — also once the job is submitted or ready to issue, until it is issued.
 */
export type JobWriteKind = 'details' | 'record' | 'field' | 'delete' | 'signoff';

/**
 * Why a write or transition is refused. `role`: this user may never do it on this job (HTTP 403);
 * `state`: it is not possible in the job's current status (HTTP 409).
 */
export interface Denial {
  kind: 'role' | 'state';
  code: string;
  message: string;
}

export type Decision = { isAllowed: true } | ({ isAllowed: false } & Denial);

const ALLOW: Decision = { isAllowed: true };
const deny = (kind: Denial['kind'], code: string, message: string): Decision => ({ isAllowed: false, kind, code, message });

const isOffice = (role: Role) => role === 'admin' || role === 'office';

/** Statuses in which the crew still records on site. */
const CREW_EDITABLE: readonly JobStatus[] = ['draft', 'in_progress'];

function isOnCrew(actor: JobActor, job: JobAccessFacts): boolean {
  return job.crewLeadUserId === actor.userId || job.crewUserIds.includes(actor.userId);
}

/**
 * May `actor` make a write of `kind` to `job`? Office and admin edit any job of the company until it is
 * issued; a crew lead edits the record of jobs they lead or are assigned to while it is a draft or in
 * progress; a technician adds field data (depth readings, checks) on assigned jobs in the same window;
 * a draft job can be deleted by office/admin only. Homeowners never write to jobs.
 */
export function canWriteJob(actor: JobActor, job: JobAccessFacts, kind: JobWriteKind): Decision {
  if (actor.role === 'homeowner') return deny('role', 'ROLE_NOT_ALLOWED', 'Homeowners cannot change jobs.');
  if (kind === 'delete') {
    if (!isOffice(actor.role)) return deny('role', 'ROLE_NOT_ALLOWED', 'Only the office can delete a job.');
    if (job.status !== 'draft') {
      return deny('state', 'JOB_NOT_DRAFT', 'Only a draft job can be deleted.');
    }
    return ALLOW;
  }
  if (job.status === 'issued') {
    return deny('state', 'JOB_ISSUED', 'This job is issued: reopen it to make a new revision before changing it.');
  }
  if (isOffice(actor.role)) return ALLOW;

  if (actor.role === 'tech' && kind !== 'field') {
    return deny('role', 'ROLE_NOT_ALLOWED', 'Technicians add depth readings and checks; the crew lead records the rest.');
  }
  if (actor.role === 'lead' && kind === 'details') {
    return deny('role', 'ROLE_NOT_ALLOWED', 'Only the office changes a job’s details; a crew lead may change its notes.');
  }
  if (!isOnCrew(actor, job)) {
    return deny('role', 'NOT_ON_CREW', 'You are not on this job’s crew.');
  }
  if (kind === 'signoff') return ALLOW;
  if (!CREW_EDITABLE.includes(job.status)) {
    return deny('state', 'JOB_SUBMITTED', 'This job has been submitted: the office must send it back before the crew changes it.');
  }
  return ALLOW;
}

/** One allowed move of the status machine, and who may make it. */
interface Transition {
  from: JobStatus;
  to: JobStatus;
  /** The crew lead may make it on jobs they lead or are assigned to (office/admin always may). */
  isCrewLeadAllowed: boolean;
  isCommentRequired: boolean;
  /** Reopening an issued job starts the next revision. */
  isNewRevision: boolean;
}

/**
 * The status machine. `issued` is set only when a handover packet is issued, never through this table.
 * Sending back (submitted or ready to issue → in progress) needs a comment telling the crew why.
 */
export const JOB_TRANSITIONS: readonly Transition[] = [
  { from: 'draft', to: 'in_progress', isCrewLeadAllowed: true, isCommentRequired: false, isNewRevision: false },
  { from: 'in_progress', to: 'submitted', isCrewLeadAllowed: true, isCommentRequired: false, isNewRevision: false },
  { from: 'submitted', to: 'in_progress', isCrewLeadAllowed: false, isCommentRequired: true, isNewRevision: false },
  { from: 'submitted', to: 'ready_to_issue', isCrewLeadAllowed: false, isCommentRequired: false, isNewRevision: false },
  { from: 'ready_to_issue', to: 'in_progress', isCrewLeadAllowed: false, isCommentRequired: true, isNewRevision: false },
  { from: 'issued', to: 'in_progress', isCrewLeadAllowed: false, isCommentRequired: false, isNewRevision: true },
];

/** Statuses a client may ask for through the status endpoint. */
export const REQUESTABLE_STATUSES = ['in_progress', 'submitted', 'ready_to_issue'] as const satisfies readonly JobStatus[];

export type TransitionDecision =
  | { isAllowed: true; isNewRevision: boolean }
  | ({ isAllowed: false } & Denial);

/**
 * May `actor` move `job` to `to` (with `comment`)? Checks, in order: the role may change statuses at
 * all, the move exists in the machine, the role may make this move on this job, and a required
 * comment is present (code `COMMENT_REQUIRED`, reported by the API as a 400 on `comment`).
 */
export function canTransition(
  actor: JobActor,
  job: JobAccessFacts,
  to: JobStatus,
  comment: string | undefined,
): TransitionDecision {
  if (actor.role === 'homeowner' || actor.role === 'tech') {
    return { isAllowed: false, kind: 'role', code: 'ROLE_NOT_ALLOWED', message: 'Your role cannot change a job’s status.' };
  }
  const transition = JOB_TRANSITIONS.find((t) => t.from === job.status && t.to === to);
  if (!transition) {
    return {
      isAllowed: false,
      kind: 'state',
      code: 'INVALID_TRANSITION',
      message: `A job that is ${JOB_STATUS_LABELS[job.status].toLowerCase()} cannot be moved to ${JOB_STATUS_LABELS[to].toLowerCase()}.`,
    };
  }
  if (actor.role === 'lead') {
    if (!transition.isCrewLeadAllowed) {
      return { isAllowed: false, kind: 'role', code: 'ROLE_NOT_ALLOWED', message: 'Only the office reviews a submitted job.' };
    }
    if (!isOnCrew(actor, job)) {
      return { isAllowed: false, kind: 'role', code: 'NOT_ON_CREW', message: 'You are not on this job’s crew.' };
    }
  }
  if (transition.isCommentRequired && (comment === undefined || comment.trim() === '')) {
    return { isAllowed: false, kind: 'state', code: 'COMMENT_REQUIRED', message: 'Say why the job goes back to the crew.' };
  }
  return { isAllowed: true, isNewRevision: transition.isNewRevision };
}

/**
 * May `actor` issue a handover packet for `job`? Only office/admin, only from `ready_to_issue`: this is
 * the one path to `issued` (the status machine above never reaches it).
 */
export function canIssuePacket(actor: JobActor, job: Pick<JobAccessFacts, 'status'>): Decision {
  if (!isOffice(actor.role)) return deny('role', 'ROLE_NOT_ALLOWED', 'Only the office issues handover packets.');
  if (job.status !== 'ready_to_issue') {
    return deny('state', 'JOB_NOT_READY_TO_ISSUE', `A job that is ${JOB_STATUS_LABELS[job.status].toLowerCase()} cannot be issued: the office must mark it ready to issue first.`);
  }
  return ALLOW;
}
