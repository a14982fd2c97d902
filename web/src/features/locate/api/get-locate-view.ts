import { type LocateViewResponse, LocateViewResponseSchema } from '@domain/locate/locate-link.schema';

import { apiRequest, isApiError } from '../../../lib/api-client';

export type { LocateViewResponse };

/** The public locate view for a link's token. No session: whoever holds the link may read it. */
export function getLocateView(token: string, { signal }: { signal?: AbortSignal } = {}): Promise<LocateViewResponse> {
  return apiRequest(`/api/locate/${encodeURIComponent(token)}`, LocateViewResponseSchema, { signal, auth: false });
}

/** Waits between tries of a request that failed on the way (1 s, then 2 s), as the app's queries do. */
const RETRY_DELAYS_MS = [1_000, 2_000];

/**
 * The locate view, tried again after a failure on the way (no answer, a server error) at most twice.
 * Never again after a refusal: every open is logged, and a miss (404) counts towards the rate limit (429).
 */
export async function loadLocateView(token: string, retryDelaysMs: readonly number[] = RETRY_DELAYS_MS): Promise<LocateViewResponse> {
  for (let attempt = 0; ; attempt += 1) {
    try {
      return await getLocateView(token);
    } catch (error) {
      const delay = retryDelaysMs[attempt];
      if (delay === undefined || (isApiError(error) && (error.status === 404 || error.status === 429))) throw error;
      await new Promise((resolve) => setTimeout(resolve, delay));
    }
  }
}

/** What the page says instead of the map: the link is gone, too many tries, or it could not be loaded. */
export function unavailableReason(error: unknown): 'not-valid' | 'rate-limited' | 'error' {
  if (isApiError(error) && error.status === 404) return 'not-valid';
  if (isApiError(error) && error.status === 429) return 'rate-limited';
  return 'error';
}
