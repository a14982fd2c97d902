import type { Role } from '../auth/roles.js';
import { JOB_STATUS_LABELS, type Decision, type JobStatus } from '../jobs/job-rules.js';

/**
 * What a write to a site changes:
 * - `details`: its name, address, customer and notes (the office's; no job's record moves);
 * - `geometry`: anything a job's as-built is placed by — reference points, north bearing, WGS 84
 *   origin, the plan image and its calibration, and any other shape drawn on the site's plan. A
 *   geometry change moves what every job on the site shows, so it is held to the jobs' statuses.
 */
export type SiteWriteKind = 'details' | 'geometry';

/** Jobs whose crew still records: a geometry change reaches them (their versions are bumped). */
export const SITE_OPEN_JOB_STATUSES: readonly JobStatus[] = ['draft', 'in_progress'];
/** Jobs under the office's review: the site's geometry is frozen until they are sent back or issued. */
export const SITE_FREEZING_JOB_STATUSES: readonly JobStatus[] = ['submitted', 'ready_to_issue'];

export interface SiteJobFacts {
  id: string;
  title: string;
  status: JobStatus;
  crewLeadUserId: string | null;
  /** Users assigned to the job's crew (technicians and extra leads). */
  crewUserIds: readonly string[];
}

export interface SiteActor {
  role: Role;
  userId: string;
}

/** A refused site write: `jobs` names the jobs that hold the site (status denials only). */
export type SiteDecision = Decision & { jobs?: { id: string; title: string; status: JobStatus }[] };

const isOffice = (role: Role) => role === 'admin' || role === 'office';

function isOnCrew(userId: string, job: SiteJobFacts): boolean {
  return job.crewLeadUserId === userId || job.crewUserIds.includes(userId);
}

/** `"Back garden" (submitted), "Patio" (ready to issue)` */
export function describeJobs(jobs: readonly { title: string; status: JobStatus }[]): string {
  return jobs.map((j) => `“${j.title}” (${JOB_STATUS_LABELS[j.status].toLowerCase()})`).join(', ');
}

/**
 * May `actor` make a write of `kind` to a site whose jobs are `jobs`? Checks who first (403), then the
 * jobs' statuses (409), as `canWriteJob` does:
 * - details: admin and office only;
 * - geometry: admin and office, and a crew lead on the crew of an open (draft or in progress) job on
 *   the site; refused for everyone while any job on the site is submitted or ready to issue (the
 *   office is reviewing a record the change would move). Issued jobs do not hold the site: their
 *   packets are frozen, and reopening one starts a revision that shows the site as it is then.
 */
export function canWriteSite(actor: SiteActor, jobs: readonly SiteJobFacts[], kind: SiteWriteKind): SiteDecision {
  if (actor.role === 'homeowner' || actor.role === 'tech') {
    return { isAllowed: false, kind: 'role', code: 'ROLE_NOT_ALLOWED', message: 'Your role cannot change sites.' };
  }
  if (kind === 'details' && !isOffice(actor.role)) {
    return {
      isAllowed: false,
      kind: 'role',
      code: 'ROLE_NOT_ALLOWED',
      message: 'Only the office changes a site’s name, address, customer and notes.',
    };
  }
  if (kind === 'geometry' && !isOffice(actor.role)) {
    const isOnOpenCrew = jobs.some((j) => SITE_OPEN_JOB_STATUSES.includes(j.status) && isOnCrew(actor.userId, j));
    if (!isOnOpenCrew) {
      return {
        isAllowed: false,
        kind: 'role',
        code: 'NOT_ON_SITE_CREW',
        message: 'Only the office, or a crew lead on the crew of an open job at this site, may change its plan and reference points.',
      };
    }
  }
  if (kind === 'geometry') {
    const holding = jobs.filter((j) => SITE_FREEZING_JOB_STATUSES.includes(j.status));
    if (holding.length > 0) {
      return {
        isAllowed: false,
        kind: 'state',
        code: 'SITE_JOBS_IN_REVIEW',
        message:
          `Jobs on this site are being reviewed: ${describeJobs(holding)}. Changing the site’s plan or reference points ` +
          'would move what they show: send them back to the crew (or issue them) first.',
        jobs: holding.map((j) => ({ id: j.id, title: j.title, status: j.status })),
      };
    }
  }
  return { isAllowed: true };
}

/** What every versioned site write answers with (the schema lives with the other site contracts). */
export type { SiteVersionResponse } from './site.schema.js';
