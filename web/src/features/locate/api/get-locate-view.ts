import type { LocateViewResponse } from '@domain/locate/locate-link.schema';

import { ApiError, isApiError } from '../../../lib/api-error';
import { getPublicJson } from '../../../lib/public-api';

export type { LocateViewResponse };

/**
 * The public locate view for a link's token. No session: whoever holds the link may read it. The page
 * loads neither zod nor the session code (issue 17: building the schemas alone cost a phone 200-300 ms),
 * so in production the answer is taken as the API's own schema types it; in development and tests it is
 * checked against `LocateViewResponseSchema` (loaded only then) and an answer that does not fit fails
 * as api-client.ts fails it.
 */
export async function getLocateView(token: string, { signal }: { signal?: AbortSignal } = {}): Promise<LocateViewResponse> {
  const answer = await getPublicJson(`/api/locate/${encodeURIComponent(token)}`, { signal });
  if (import.meta.env.DEV) return checkedInDevelopment(answer);
  return answer as LocateViewResponse;
}

async function checkedInDevelopment(answer: unknown): Promise<LocateViewResponse> {
  const { LocateViewResponseSchema } = await import('@domain/locate/locate-link.schema');
  const parsed = LocateViewResponseSchema.safeParse(answer);
  if (parsed.success) return parsed.data;
  throw new ApiError({ status: 200, code: 'UNEXPECTED_RESPONSE', message: 'The server sent an answer this app does not understand.' });
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
