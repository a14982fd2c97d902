import { ApiError, type ApiIssue } from './api-error';
import { readBody, timedFetch } from './timed-fetch';

/**
 * A GET of a public endpoint of our API, for a page without a session (the public locate page and the
 * sign-in page, issue 17):
 * no access token, no refresh on a 401, no zod and no session code, so such a page loads none of them.
 * The request is sent as api-client.ts sends it (`Accept: application/json`, credentials included), so a
 * `Link: rel=preload; as=fetch; crossorigin=use-credentials` the server sent with the page is the request
 * used. Resolves to the parsed JSON body, unchecked (the caller knows its shape); throws `ApiError` as
 * api-client.ts does: the status for a non-2xx answer, 0 for no answer or one later than `timeoutMs`.
 */
export async function getPublicJson(path: string, { signal, timeoutMs = 15_000 }: { signal?: AbortSignal; timeoutMs?: number } = {}): Promise<unknown> {
  const response = await timedFetch(path, { headers: { Accept: 'application/json' } }, { signal, timeoutMs });
  return bodyOrThrow(response);
}

/**
 * A POST of a JSON body to a public endpoint of our API, for the sign-in page (issue 17): sent as
 * api-client.ts sends a request with `auth: false` (JSON, credentials included, so the refresh cookie the
 * answer sets is kept), without zod or the session. Resolves to the parsed answer, unchecked; throws
 * `ApiError` as `getPublicJson` does, with the API's validation `issues` when it names any.
 */
export async function postPublicJson(path: string, body?: unknown, { signal, timeoutMs = 15_000 }: { signal?: AbortSignal; timeoutMs?: number } = {}): Promise<unknown> {
  const headers: Record<string, string> = { Accept: 'application/json' };
  if (body !== undefined) headers['Content-Type'] = 'application/json';
  const response = await timedFetch(
    path,
    { method: 'POST', headers, body: body === undefined ? undefined : JSON.stringify(body) },
    { signal, timeoutMs },
  );
  return bodyOrThrow(response);
}

async function bodyOrThrow(response: Response): Promise<unknown> {
  const body = await readBody(response);
  if (response.ok) return body;
  // The API's error body (`{ message, code, issues }`, message sometimes a list); anything else keeps the status.
  const { message, code, issues } = (typeof body === 'object' && body !== null ? body : {}) as { message?: unknown; code?: unknown; issues?: unknown };
  const said = typeof message === 'string' ? message : Array.isArray(message) ? message.filter((m) => typeof m === 'string').join(' ') : '';
  throw new ApiError({
    status: response.status,
    message: said || response.statusText || `Request failed with status ${response.status}.`,
    code: typeof code === 'string' ? code : undefined,
    issues: readIssues(issues),
  });
}

/** The validation issues of an error body (`[{ path, message }]`, path a string or a list), as api-client reads them. */
function readIssues(issues: unknown): ApiIssue[] {
  if (!Array.isArray(issues)) return [];
  const read: ApiIssue[] = [];
  for (const issue of issues as unknown[]) {
    const { path, message } = (typeof issue === 'object' && issue !== null ? issue : {}) as { path?: unknown; message?: unknown };
    if (typeof message !== 'string') continue;
    if (typeof path === 'string') read.push({ path, message });
    else if (Array.isArray(path)) read.push({ path: path.map(String).join('.'), message });
  }
  return read;
}
