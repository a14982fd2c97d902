import { BadRequestException, ConflictException, ForbiddenException, NotFoundException, PreconditionFailedException } from '@nestjs/common';

import type { Denial } from '../domain/jobs/job-rules.js';
import type { FieldIssue } from '../domain/jobs/record-validation.js';

export function jobNotFound(): NotFoundException {
  return new NotFoundException({ message: 'No such job.', code: 'JOB_NOT_FOUND' });
}

export function recordNotFound(what: 'zone' | 'item' | 'run' | 'depth reading' | 'check' | 'channel'): NotFoundException {
  return new NotFoundException({
    message: `No such ${what} on this job.`,
    code: `${what.toUpperCase().replace(/ /g, '_')}_NOT_FOUND`,
  });
}

/**
 * 412 Precondition Failed (RFC 9110 §13.1.1: the If-Match version is not the job's current one) with the
 * job's current version: the client reloads (or merges) and tries again. A state conflict stays 409.
 */
export function versionConflict(currentVersion: number): PreconditionFailedException {
  return new PreconditionFailedException({
    message: `Someone saved this job after you opened it (it is now at version ${currentVersion}). Reload it, check your change and save again.`,
    code: 'VERSION_CONFLICT',
    currentVersion,
  });
}

/** A role denial is 403; a denial because of the job's current status is 409. */
export function denied(denial: Denial): ForbiddenException | ConflictException {
  const body = { message: denial.message, code: denial.code };
  return denial.kind === 'role' ? new ForbiddenException(body) : new ConflictException(body);
}

export function invalid(issues: FieldIssue[]): BadRequestException {
  const first = issues[0];
  return new BadRequestException({
    message: first ? `${first.path || 'body'}: ${first.message}` : 'Invalid request',
    code: 'VALIDATION_FAILED',
    issues,
  });
}

/** Deleting something the rest of the record still points at. */
export function inUse(what: string, issues: FieldIssue[]): ConflictException {
  const first = issues[0];
  return new ConflictException({
    message: `This ${what} is still in use${first ? ` (${first.path}: ${first.message})` : ''}: change or delete what uses it first.`,
    code: 'IN_USE',
    issues,
  });
}

/** Another open job of the site has an unissued change to the same record of the site's system. */
export function recordHeldByOtherJob(what: 'item' | 'run', other: { jobId: string; title: string }): ConflictException {
  return new ConflictException({
    message: `This ${what} is being changed by another open job on this property ("${other.title}"). Issue or undo that job's change first, then change it here.`,
    code: 'RECORD_CHANGED_BY_OTHER_JOB',
    otherJobId: other.jobId,
  });
}
