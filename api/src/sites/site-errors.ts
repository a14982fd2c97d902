import { ConflictError, ForbiddenError, NotFoundError, VersionConflictError } from '../domain/errors.js';
import type { SiteDecision } from '../domain/sites/site-rules.js';

export function siteNotFound(): NotFoundError {
  return new NotFoundError('SITE_NOT_FOUND', 'No such site.');
}

/** 412 Precondition Failed (RFC 9110 §13.1.1) with the site's current version: the client reloads the site and tries again. */
export function siteVersionConflict(currentVersion: number): VersionConflictError {
  return new VersionConflictError(
    `Someone changed this site after you opened it (it is now at version ${currentVersion}). Reload it, check your change and save again.`,
    currentVersion,
  );
}

/**
 * A role denial is 403; a denial because of the site's jobs' statuses is 409 whose message names those
 * jobs (the body keeps the API's one error shape).
 */
export function siteDenied(decision: SiteDecision & { isAllowed: false }): ForbiddenError | ConflictError {
  return decision.kind === 'role' ? new ForbiddenError(decision.code, decision.message) : new ConflictError(decision.code, decision.message);
}
