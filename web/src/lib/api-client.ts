import { z } from 'zod';

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

  constructor(init: { status: number; message: string; code?: string; issues?: readonly ApiIssue[] }) {
    super(init.message);
    this.name = 'ApiError';
    this.status = init.status;
    this.code = init.code;
    this.issues = init.issues ?? [];
  }
}

export function isApiError(error: unknown): error is ApiError {
  return error instanceof ApiError;
}

// The API's error body: Nest's `{ statusCode, error, message }` plus our `code` and `issues`.
// Nest sends `message` as a list for some built-in errors, so both shapes are accepted.
const ErrorBodySchema = z.object({
  statusCode: z.number().optional(),
  error: z.string().optional(),
  message: z.union([z.string(), z.array(z.string())]).optional(),
  code: z.string().optional(),
  issues: z
    .array(
      z.object({
        path: z.union([z.string(), z.array(z.union([z.string(), z.number()]))]),
        message: z.string(),
      }),
    )
    .optional(),
});

export type ApiRequestOptions = Omit<RequestInit, 'body'> & {
  /** Sent as JSON unless it is already a body type fetch understands (FormData, Blob, …). */
  body?: unknown;
  /**
   * Non-2xx statuses whose body is a normal answer for this endpoint (the health check answers 503
   * with a report). Their body is parsed and returned instead of thrown.
   */
  acceptStatuses?: readonly number[];
  /** Give up after this long; the request then fails with status 0. */
  timeoutMs?: number;
};

const DEFAULT_TIMEOUT_MS = 15_000;

/**
 * Calls our own API (`/api/...`). Returns the parsed JSON body (`undefined` for an empty body),
 * validated by `schema` when one is given; throws `ApiError` otherwise.
 */
export async function apiRequest<T>(
  path: string,
  schema: z.ZodType<T>,
  options?: ApiRequestOptions,
): Promise<T>;
export async function apiRequest(path: string, schema?: undefined, options?: ApiRequestOptions): Promise<unknown>;
export async function apiRequest<T>(
  path: string,
  schema?: z.ZodType<T>,
  options: ApiRequestOptions = {},
): Promise<T | unknown> {
  const { body, acceptStatuses = [], timeoutMs = DEFAULT_TIMEOUT_MS, headers, signal, ...init } = options;

  const requestHeaders = new Headers(headers);
  requestHeaders.set('Accept', 'application/json');
  let requestBody: BodyInit | undefined;
  if (body === undefined || isNativeBody(body)) {
    requestBody = body;
  } else {
    requestHeaders.set('Content-Type', 'application/json');
    requestBody = JSON.stringify(body);
  }

  const timeout = new AbortController();
  const timer = setTimeout(() => timeout.abort(), timeoutMs);
  const onCallerAbort = () => timeout.abort();
  signal?.addEventListener('abort', onCallerAbort, { once: true });

  let response: Response;
  try {
    response = await fetch(path, {
      ...init,
      headers: requestHeaders,
      body: requestBody,
      credentials: 'include',
      signal: timeout.signal,
    });
  } catch (cause) {
    // Let TanStack Query see its own cancellations as aborts, not as failures.
    if (signal?.aborted) throw cause;
    throw new ApiError({
      status: 0,
      code: timeout.signal.aborted ? 'TIMEOUT' : 'NETWORK_ERROR',
      message: timeout.signal.aborted ? 'The server took too long to answer.' : 'Cannot reach the server.',
    });
  } finally {
    clearTimeout(timer);
    signal?.removeEventListener('abort', onCallerAbort);
  }

  const payload = await readBody(response);

  if (!response.ok && !acceptStatuses.includes(response.status)) {
    throw toApiError(response, payload);
  }
  if (!schema) return payload;

  const parsed = schema.safeParse(payload);
  if (!parsed.success) {
    throw new ApiError({
      status: response.status,
      code: 'UNEXPECTED_RESPONSE',
      message: 'The server sent an answer this app does not understand.',
    });
  }
  return parsed.data;
}

function isNativeBody(body: unknown): body is BodyInit {
  return (
    body instanceof FormData ||
    body instanceof Blob ||
    body instanceof URLSearchParams ||
    body instanceof ArrayBuffer ||
    typeof body === 'string'
  );
}

async function readBody(response: Response): Promise<unknown> {
  const text = await response.text();
  if (text === '') return undefined;
  const contentType = response.headers.get('Content-Type') ?? '';
  if (!contentType.includes('json')) return text;
  try {
    return JSON.parse(text) as unknown;
  } catch {
    return text;
  }
}

function toApiError(response: Response, payload: unknown): ApiError {
  const parsed = ErrorBodySchema.safeParse(payload);
  const fallbackMessage = response.statusText || `Request failed with status ${response.status}.`;
  if (!parsed.success) {
    return new ApiError({ status: response.status, message: fallbackMessage });
  }
  const { message, error, code, issues } = parsed.data;
  return new ApiError({
    status: response.status,
    message: (Array.isArray(message) ? message.join(' ') : message) ?? error ?? fallbackMessage,
    code,
    issues: issues?.map((issue) => ({
      path: Array.isArray(issue.path) ? issue.path.join('.') : issue.path,
      message: issue.message,
    })),
  });
}
