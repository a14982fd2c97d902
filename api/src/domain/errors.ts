/**
 * The one way the API raises an expected error: services and domain code throw these, and the global
 * exception filter (`common/http-exception.filter.ts`) turns each into the API's error body
 * `{ statusCode, error, message, code, issues?, currentVersion? }`. Each carries a stable `code` that
 * clients rely on. HTTP-only refusals outside a service's rules (a missing header, an upload's size
 * limit, a rate limit) stay Nest exceptions.
 */

/** One field that was wrong, by its path in the request (`runs[0].lengthM`, `body`, `file`). */
export interface FieldIssue {
  path: string;
  message: string;
}

export class DomainError extends Error {
  constructor(
    readonly code: string,
    message: string,
    /** The fields the error is about, when it is about fields. */
    readonly issues?: FieldIssue[],
  ) {
    super(message);
    this.name = new.target.name;
  }
}

/** 404: the thing does not exist, or not for this caller's company. */
export class NotFoundError extends DomainError {}

/** 409: the request conflicts with the state of the record (its status, a record still in use). */
export class ConflictError extends DomainError {}

/** 403: the caller's role may not do this. */
export class ForbiddenError extends DomainError {}

/**
 * 412 Precondition Failed (RFC 9110 §13.1.1): the version the client sent (If-Match / expectedVersion)
 * is not the record's current one. Carries the current version so the client can reload or merge.
 */
export class VersionConflictError extends DomainError {
  constructor(
    message: string,
    readonly currentVersion: number,
  ) {
    super('VERSION_CONFLICT', message);
  }
}

/**
 * 400: the input is malformed or out of range; `issues` names every field that was wrong, and the message
 * starts with the first one (`runs[0].lengthM: must be positive`). The code is `VALIDATION_FAILED` unless
 * a more precise one is given.
 */
export class ValidationError extends DomainError {
  constructor(issues: FieldIssue[], options: { message?: string; code?: string } = {}) {
    const first = issues[0];
    const message = options.message ?? (first ? `${first.path || 'body'}: ${first.message}` : 'Invalid request');
    super(options.code ?? 'VALIDATION_FAILED', message, issues);
  }
}

/** 422: a request that is well-formed but breaks a rule of the trade or of the workflow. */
export class RuleViolationError extends DomainError {}

/**
 * The value a lookup found, or the given 404 when it found nothing (`undefined` or `null`).
 * `await findOrFail(repository.findById(companyId, id), jobNotFound)`.
 */
export async function findOrFail<T>(
  lookup: T | null | undefined | PromiseLike<T | null | undefined>,
  notFound: () => NotFoundError,
): Promise<T> {
  const found = await lookup;
  if (found === undefined || found === null) throw notFound();
  return found;
}
