/**
 * The error every request to our API fails with (`ApiError`), in a module of its own without zod or the
 * session: api-client.ts (the app's requests) and public-api.ts (the public locate page's, issue 17) both
 * throw it, and api-client.ts re-exports it for the rest of the app.
 */

/** One problem with a request field, as the API's validation pipe reports it. */
export type ApiIssue = { path: string; message: string };

/**
 * A request that did not succeed: a non-2xx answer from the API, an answer we could not read, or
 * no answer at all (`status` 0).
 */
export class ApiError extends Error {
  readonly status: number;
  readonly code: string | undefined;
  readonly issues: readonly ApiIssue[];
  /** With `VERSION_CONFLICT`: the version the job has reached on the server. */
  readonly currentVersion: number | undefined;

  constructor(init: {
    status: number;
    message: string;
    code?: string;
    issues?: readonly ApiIssue[];
    currentVersion?: number;
  }) {
    super(init.message);
    this.name = 'ApiError';
    this.status = init.status;
    this.code = init.code;
    this.issues = init.issues ?? [];
    this.currentVersion = init.currentVersion;
  }
}

export function isApiError(error: unknown): error is ApiError {
  return error instanceof ApiError;
}
