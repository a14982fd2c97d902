import type { SignupStatusResponse } from '@domain/signup/signup.schema';

import { isApiError } from '../../../lib/api-error';
import { getPublicJson, postPublicJson } from '../../../lib/public-api';

/*
 * The sign-in page's requests (web/sign-in.html, issue 17): without zod, the session or the API client,
 * so the page loads none of them. The page keeps no token: after a sign-in it loads the app, which trades
 * the refresh cookie the answer set for a session of its own (restoreSession, as on any reload).
 */

/** What the sign-in form sends; the server checks it again (SignInSchema) and answers 400 with issues. */
export type SignInFields = { email: string; password: string };

/**
 * Signs in: the answer sets the refresh cookie (HttpOnly, Path=/api/auth), which is all the app needs.
 * The access token in the answer is dropped. Throws `ApiError` (401 `SIGN_IN_FAILED`, 429, 400 with
 * issues, status 0 with no answer).
 */
export async function signInForCookie(fields: SignInFields): Promise<void> {
  await postPublicJson('/api/auth/sign-in', fields);
}

/** The Web Lock under which the app refreshes (lib/session-sync.ts, REFRESH_LOCK): one tab at a time spends the cookie. */
const REFRESH_LOCK = 'loamline-refresh';

/**
 * Whether the refresh cookie still holds a session (someone already signed in: another tab, a bookmark),
 * asked once when the page opens. The server rotates the cookie on every use, so this runs under the
 * app's refresh lock like any refresh of the app; the new cookie is what the app then restores from.
 * `false` when the server refuses; `undefined` when it cannot be asked (no signal, an error).
 */
export async function hasSession({ timeoutMs = 15_000 }: { timeoutMs?: number } = {}): Promise<boolean | undefined> {
  const ask = async () => {
    try {
      await postPublicJson('/api/auth/refresh', undefined, { timeoutMs });
      return true;
    } catch (error) {
      return isApiError(error) && error.status === 401 ? false : undefined;
    }
  };
  const locks = typeof navigator === 'undefined' ? undefined : navigator.locks;
  return locks ? locks.request(REFRESH_LOCK, ask) : ask();
}

/** Whether companies may sign up here and whether any exists yet (GET /api/signup/status, public). */
export async function getSignupStatus(): Promise<SignupStatusResponse> {
  return (await getPublicJson('/api/signup/status')) as SignupStatusResponse;
}
