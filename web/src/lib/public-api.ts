import { ApiError } from './api-error';

/**
 * A GET of a public endpoint of our API, for a page without a session (the public locate page, issue 17):
 * no access token, no refresh on a 401, no zod and no session code, so such a page loads none of them.
 * The request is sent as api-client.ts sends it (`Accept: application/json`, credentials included), so a
 * `Link: rel=preload; as=fetch; crossorigin=use-credentials` the server sent with the page is the request
 * used. Resolves to the parsed JSON body, unchecked (the caller knows its shape); throws `ApiError` as
 * api-client.ts does: the status for a non-2xx answer, 0 for no answer or one later than `timeoutMs`.
 */
export async function getPublicJson(path: string, { signal, timeoutMs = 15_000 }: { signal?: AbortSignal; timeoutMs?: number } = {}): Promise<unknown> {
  const timeout = new AbortController();
  const timer = setTimeout(() => timeout.abort(), timeoutMs);
  const onCallerAbort = () => timeout.abort();
  signal?.addEventListener('abort', onCallerAbort, { once: true });
  let response: Response;
  let text: string;
  try {
    response = await fetch(path, { headers: { Accept: 'application/json' }, credentials: 'include', signal: timeout.signal });
    text = await response.text();
  } catch (cause) {
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
  const body = readJson(text, response.headers.get('Content-Type') ?? '');
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

function readJson(text: string, contentType: string): unknown {
  if (text === '') return undefined;
  if (!contentType.includes('json')) return text;
  try {
    return JSON.parse(text) as unknown;
  } catch {
    return text;
  }
}
