import { ApiError } from './api-error';

/**
 * `fetch` of our API with the session cookie (credentials included), given up after `timeoutMs`: the
 * one network step of the app's client (api-client.ts) and of the session-free public pages
 * (public-api.ts). No zod and no session code here, so the public locate page can load it. A caller's
 * own abort is passed on as an abort (TanStack Query cancels that way); no answer, or one later than
 * `timeoutMs`, is an `ApiError` with status 0.
 */
export async function timedFetch(path: string, init: RequestInit, { signal, timeoutMs }: { signal?: AbortSignal | null; timeoutMs: number }): Promise<Response> {
  const timeout = new AbortController();
  const timer = setTimeout(() => timeout.abort(), timeoutMs);
  const onCallerAbort = () => timeout.abort();
  signal?.addEventListener('abort', onCallerAbort, { once: true });
  try {
    return await fetch(path, { ...init, credentials: 'include', signal: timeout.signal });
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
}

/** An answer's body: parsed JSON when it says it is JSON (its text if that fails), else its text; nothing for an empty body. */
export async function readBody(response: Response): Promise<unknown> {
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
