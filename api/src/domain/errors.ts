/**
 * Errors raised by framework-free domain code. Each carries a stable `code` that clients can rely on;
 * the API's global exception filter maps the subclasses to HTTP statuses (404, 409, 422).
 */
export class DomainError extends Error {
  constructor(
    readonly code: string,
    message: string,
  ) {
    super(message);
    this.name = new.target.name;
  }
}

export class NotFoundError extends DomainError {}

export class ConflictError extends DomainError {}

/** A request that is well-formed but breaks a rule of the trade or of the workflow. */
export class RuleViolationError extends DomainError {}
