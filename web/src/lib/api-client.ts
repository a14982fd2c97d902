import { z } from 'zod';
import { SessionResponseSchema } from '@domain/auth/auth.schema';

import { ApiError, isApiError } from './api-error';
import { readBody, timedFetch } from './timed-fetch';
import { clearSession, getAccessToken, getSessionState, setSession, type Session } from './session';
import { refreshAcrossTabs } from './session-sync';

// Defined without zod or the session (the public locate page throws it too); the app imports it from here.
export { ApiError, type ApiIssue, isApiError } from './api-error';

// The API's error body: Nest's `{ statusCode, error, message }` plus our `code` and `issues`.
// Nest sends `message` as a list for some built-in errors, so both shapes are accepted.
const ErrorBodySchema = z.object({
  statusCode: z.number().optional(),
  error: z.string().optional(),
  message: z.union([z.string(), z.array(z.string())]).optional(),
  code: z.string().optional(),
  currentVersion: z.number().int().optional(),
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
  /**
   * Send the access token, and on a 401 refresh the session once and retry (default). `false` for the
   * sign-in endpoints themselves, which must never trigger a refresh.
   */
  auth?: boolean;
};

const DEFAULT_TIMEOUT_MS = 15_000;

/**
 * Calls our own API (`/api/...`). Returns the parsed JSON body (`undefined` for an empty body),
 * validated by `schema` when one is given; throws `ApiError` otherwise.
 *
 * A 401 ends in an `ApiError` with status 401 only after a refresh has failed too; the session is then
 * cleared, and the signed-in area (not this client) takes the user to the sign-in page.
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
  const { acceptStatuses = [] } = options;
  const response = await authorizedFetch(path, options);
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

/** Like `apiRequest`, for endpoints that answer with a file (attachments): returns the bytes. */
export async function apiBlob(path: string, options: ApiRequestOptions = {}): Promise<Blob> {
  const response = await authorizedFetch(path, options);
  if (!response.ok) throw toApiError(response, await readBody(response));
  return response.blob();
}

let refreshInFlight: Promise<Session | null> | undefined;

/**
 * Trades the refresh cookie for a new access token. Resolves to the new session, or `null` when the
 * server refuses (no cookie, session ended); throws `ApiError` only when the server cannot be reached.
 *
 * At most one refresh is in flight: the server treats a late second use of the same cookie as theft
 * and ends the whole session, so every caller in this tab shares the same promise, and across tabs
 * one refreshes while the others wait and use its result (session-sync.ts).
 */
export function refreshSession(): Promise<Session | null> {
  refreshInFlight ??= refreshAcrossTabs(getAccessToken(), requestRefresh).finally(() => {
    refreshInFlight = undefined;
  });
  return refreshInFlight;
}

async function requestRefresh(): Promise<Session | null> {
  const wasSignedIn = getSessionState().status === 'signed-in';
  try {
    const body = await apiRequest('/api/auth/refresh', SessionResponseSchema, { method: 'POST', auth: false });
    return setSession(body);
  } catch (error) {
    if (isApiError(error) && error.status === 401) {
      clearSession(wasSignedIn ? 'expired' : 'signed-out');
      return null;
    }
    throw error;
  }
}

async function authorizedFetch(path: string, options: ApiRequestOptions): Promise<Response> {
  const { auth = true } = options;
  if (!auth) return send(path, options, undefined);
  return sendWithSession((token) => send(path, options, token), (response) => response.status);
}

/**
 * Sends with the current access token; on a 401 tries once more with a token another request has
 * refreshed meanwhile, or after refreshing the session. Shared by fetch requests and XHR uploads.
 */
export async function sendWithSession<R>(sendWith: (accessToken: string | undefined) => Promise<R>, statusOf: (answer: R) => number): Promise<R> {
  const sentToken = getAccessToken();
  const answer = await sendWith(sentToken);
  if (statusOf(answer) !== 401 || getSessionState().status === 'signed-out') return answer;

  // Another request may have refreshed while this one was on its way; use that token rather than
  // spending the refresh cookie again.
  const currentToken = getAccessToken();
  if (currentToken && currentToken !== sentToken) return sendWith(currentToken);

  const session = await refreshSession();
  return session ? sendWith(session.accessToken) : answer;
}

async function send(path: string, options: ApiRequestOptions, accessToken: string | undefined): Promise<Response> {
  const {
    body,
    acceptStatuses: _acceptStatuses,
    auth: _auth,
    timeoutMs = DEFAULT_TIMEOUT_MS,
    headers,
    signal,
    ...init
  } = options;

  const requestHeaders = new Headers(headers);
  if (!requestHeaders.has('Accept')) requestHeaders.set('Accept', 'application/json');
  if (accessToken) requestHeaders.set('Authorization', `Bearer ${accessToken}`);
  let requestBody: BodyInit | undefined;
  if (body === undefined || isNativeBody(body)) {
    requestBody = body;
  } else {
    requestHeaders.set('Content-Type', 'application/json');
    requestBody = JSON.stringify(body);
  }

  return timedFetch(path, { ...init, headers: requestHeaders, body: requestBody }, { signal, timeoutMs });
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

function toApiError(response: Response, payload: unknown): ApiError {
  return apiErrorFromBody(response.status, response.statusText, payload);
}

/** The `ApiError` for a non-2xx answer with `payload` (the parsed body), however it was received. */
export function apiErrorFromBody(status: number, statusText: string, payload: unknown): ApiError {
  const parsed = ErrorBodySchema.safeParse(payload);
  const fallbackMessage = statusText || `Request failed with status ${status}.`;
  if (!parsed.success) {
    return new ApiError({ status, message: fallbackMessage });
  }
  const { message, error, code, issues, currentVersion } = parsed.data;
  return new ApiError({
    status,
    message: (Array.isArray(message) ? message.join(' ') : message) ?? error ?? fallbackMessage,
    code,
    currentVersion,
    issues: issues?.map((issue) => ({
      path: Array.isArray(issue.path) ? issue.path.join('.') : issue.path,
      message: issue.message,
    })),
  });
}
