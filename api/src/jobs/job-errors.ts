import { ConflictError, type FieldIssue, ForbiddenError, NotFoundError, ValidationError, VersionConflictError } from '../domain/errors.js';
import type { Denial } from '../domain/jobs/job-rules.js';

/*
 * The job records' errors, as DomainErrors the exception filter maps to HTTP (see domain/errors.ts).
 * Named constructors, so every place that refuses the same thing says it the same way.
 */

export function jobNotFound(): NotFoundError {
  return new NotFoundError('JOB_NOT_FOUND', 'No such job.');
}

export function recordNotFound(what: 'zone' | 'item' | 'run' | 'depth reading' | 'check' | 'channel'): NotFoundError {
  return new NotFoundError(`${what.toUpperCase().replace(/ /g, '_')}_NOT_FOUND`, `No such ${what} on this job.`);
}

/**
 * 412 Precondition Failed (RFC 9110 §13.1.1: the If-Match version is not the job's current one) with the
 * job's current version: the client reloads (or merges) and tries again. A state conflict stays 409.
 */
export function versionConflict(currentVersion: number): VersionConflictError {
  return new VersionConflictError(
    `Someone saved this job after you opened it (it is now at version ${currentVersion}). Reload it, check your change and save again.`,
    currentVersion,
  );
}

/** A role denial is 403; a denial because of the job's current status is 409. */
export function denied(denial: Denial): ForbiddenError | ConflictError {
  return denial.kind === 'role' ? new ForbiddenError(denial.code, denial.message) : new ConflictError(denial.code, denial.message);
}

export function invalid(issues: FieldIssue[]): ValidationError {
  return new ValidationError(issues);
}

/** Deleting something the rest of the record still points at. */
export function inUse(what: string, issues: FieldIssue[]): ConflictError {
  const first = issues[0];
  return new ConflictError(
    'IN_USE',
    `This ${what} is still in use${first ? ` (${first.path}: ${first.message})` : ''}: change or delete what uses it first.`,
    issues,
  );
}

/**
 * Another open job of the site has an unissued change to the same record of the site's system; the
 * message names the record (by its label) and the job holding it.
 */
export function recordHeldByOtherJob(what: 'item' | 'run', label: string, other: { jobId: string; title: string }): ConflictError {
  return new ConflictError(
    'RECORD_CHANGED_BY_OTHER_JOB',
    `The ${what} "${label}" is being changed by another open job on this property ("${other.title}"). Issue or undo that job's change first, then change it here.`,
  );
}
