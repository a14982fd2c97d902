import { ConflictException, ForbiddenException, NotFoundException, PreconditionFailedException } from '@nestjs/common';

import type { SiteDecision } from '../domain/sites/site-rules.js';

export function siteNotFound(): NotFoundException {
  return new NotFoundException({ message: 'No such site.', code: 'SITE_NOT_FOUND' });
}

/** 412 Precondition Failed (RFC 9110 §13.1.1) with the site's current version: the client reloads the site and tries again. */
export function siteVersionConflict(currentVersion: number): PreconditionFailedException {
  return new PreconditionFailedException({
    message: `Someone changed this site after you opened it (it is now at version ${currentVersion}). Reload it, check your change and save again.`,
    code: 'VERSION_CONFLICT',
    currentVersion,
  });
}

/**
 * A role denial is 403; a denial because of the site's jobs' statuses is 409 whose message names those
 * jobs (the body keeps the API's one error shape).
 */
export function siteDenied(decision: SiteDecision & { isAllowed: false }): ForbiddenException | ConflictException {
  const body = { message: decision.message, code: decision.code };
  return decision.kind === 'role' ? new ForbiddenException(body) : new ConflictException(body);
}
