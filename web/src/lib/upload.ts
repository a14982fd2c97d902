import { ApiError, apiErrorFromBody, sendWithSession } from './api-client';

export type UploadProgress = { loaded: number; total: number };

export type ApiUploadOptions = {
  headers?: Record<string, string>;
  /** Called as the request body goes out (bytes of the whole multipart body). */
  onProgress?: (progress: UploadProgress) => void;
  signal?: AbortSignal;
  /**
   * Give up when no bytes have moved for this long (status 0, `TIMEOUT`). There is no limit on the
   * whole upload: a photo on one bar of signal may take minutes and still be making progress.
   */
  stallTimeoutMs?: number;
};

type XhrAnswer = { status: number; statusText: string; body: unknown };

const DEFAULT_STALL_TIMEOUT_MS = 60_000;

/**
 * POSTs `body` (multipart) to our API with XHR, because fetch cannot report upload progress. Uses the
 * same session as `apiRequest` (Bearer token, one refresh on a 401). Resolves with the parsed JSON
 * body of a 2xx; rejects with `ApiError` (status 0 when the connection dropped or stalled) or, when
 * `signal` aborts, with a DOMException named `AbortError`.
 */
export async function apiUpload(path: string, body: FormData, options: ApiUploadOptions = {}): Promise<unknown> {
  const answer = await sendWithSession(
    (token) => sendXhr(path, body, token, options),
    (result) => result.status,
  );
  if (answer.status < 200 || answer.status >= 300) throw apiErrorFromBody(answer.status, answer.statusText, answer.body);
  return answer.body;
}

function sendXhr(path: string, body: FormData, accessToken: string | undefined, options: ApiUploadOptions): Promise<XhrAnswer> {
  const { headers = {}, onProgress, signal, stallTimeoutMs = DEFAULT_STALL_TIMEOUT_MS } = options;
  return new Promise<XhrAnswer>((resolve, reject) => {
    if (signal?.aborted) {
      reject(new DOMException('The upload was cancelled.', 'AbortError'));
      return;
    }
    const xhr = new XMLHttpRequest();
    let stalled = false;
    let timer: ReturnType<typeof setTimeout> | undefined;
    const armStallTimer = () => {
      if (timer !== undefined) clearTimeout(timer);
      timer = setTimeout(() => {
        stalled = true;
        xhr.abort();
      }, stallTimeoutMs);
    };
    const onAbort = () => xhr.abort();
    const finish = () => {
      if (timer !== undefined) clearTimeout(timer);
      signal?.removeEventListener('abort', onAbort);
    };

    xhr.open('POST', path);
    xhr.withCredentials = true;
    xhr.setRequestHeader('Accept', 'application/json');
    if (accessToken) xhr.setRequestHeader('Authorization', `Bearer ${accessToken}`);
    for (const [name, value] of Object.entries(headers)) xhr.setRequestHeader(name, value);
    xhr.upload.onprogress = (event) => {
      armStallTimer();
      if (event.lengthComputable) onProgress?.({ loaded: event.loaded, total: event.total });
    };
    // The server answers only after it has decoded and stored the photo; that can take a while.
    xhr.upload.onload = () => armStallTimer();
    xhr.onload = () => {
      finish();
      resolve({ status: xhr.status, statusText: xhr.statusText, body: parseBody(xhr) });
    };
    xhr.onerror = () => {
      finish();
      reject(new ApiError({ status: 0, code: 'NETWORK_ERROR', message: 'Cannot reach the server.' }));
    };
    xhr.onabort = () => {
      finish();
      if (stalled) reject(new ApiError({ status: 0, code: 'TIMEOUT', message: 'The upload stopped moving.' }));
      else reject(new DOMException('The upload was cancelled.', 'AbortError'));
    };
    signal?.addEventListener('abort', onAbort, { once: true });
    armStallTimer();
    xhr.send(body);
  });
}

function parseBody(xhr: XMLHttpRequest): unknown {
  const text = xhr.responseText;
  if (text === '') return undefined;
  if (!(xhr.getResponseHeader('Content-Type') ?? '').includes('json')) return text;
  try {
    return JSON.parse(text) as unknown;
  } catch {
    return text;
  }
}
