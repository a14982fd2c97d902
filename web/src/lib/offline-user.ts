import { MeResponseSchema } from '@domain/auth/auth.schema';

import type { SessionUser } from './session';

/**
 * Who was last signed in on this device, without any token: lets the app open for that person with no
 * signal (a reload in a trench cannot ask the server about the refresh cookie). The first request that
 * reaches the server again refreshes the session as usual, and a refused refresh signs them out.
 * Forgotten on sign-out.
 */
const KEY = 'loamline.offline-user';

export function readRememberedUser(): SessionUser | undefined {
  try {
    const raw = localStorage.getItem(KEY);
    if (!raw) return undefined;
    const parsed = MeResponseSchema.safeParse(JSON.parse(raw));
    return parsed.success ? parsed.data : undefined;
  } catch {
    return undefined;
  }
}

export function rememberUser(user: SessionUser): void {
  try {
    localStorage.setItem(KEY, JSON.stringify(user));
  } catch {
    // Storage full or unavailable: the app still works online.
  }
}

export function forgetRememberedUser(): void {
  try {
    localStorage.removeItem(KEY);
  } catch {
    // Nothing to forget.
  }
}
