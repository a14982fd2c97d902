import { ApiError } from './api-error';
import { readBody, timedFetch } from './timed-fetch';

/**
 * A GET of a public endpoint of our API, for a page without a session (the public locate page, issue 17):
 * no access token, no refresh on a 401, no zod and no session code, so such a page loads none of them.
 * The request is sent as api-client.ts sends it (`Accept: application/json`, credentials included), so a
 * `Link: rel=preload; as=fetch; crossorigin=use-credentials` the server sent with the page is the request
 * used. Resolves to the parsed JSON body, unchecked (the caller knows its shape); throws `ApiError` as
 * api-client.ts does: the status for a non-2xx answer, 0 for no answer or one later than `timeoutMs`.
 */
export async function getPublicJson(path: string, { signal, timeoutMs = 15_000 }: { signal?: AbortSignal; timeoutMs?: number } = {}): Promise<unknown> {
  const response = await timedFetch(path, { headers: { Accept: 'application/json' } }, { signal, timeoutMs });
  const body = await readBody(response);
  if (response.ok) return body;
  // The API's error body (`{ message, code }`, message sometimes a list); anything else keeps the status.
  const { message, code } = (typeof body === 'object' && body !== null ? body : {}) as { message?: unknown; code?: unknown };
  const said = typeof message === 'string' ? message : Array.isArray(message) ? message.filter((m) => typeof m === 'string').join(' ') : '';
  throw new ApiError({
    status: response.status,
    message: said || response.statusText || `Request failed with status ${response.status}.`,
    code: typeof code === 'string' ? code : undefined,
  });
}
