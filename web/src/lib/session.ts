import { useSyncExternalStore } from 'react';
import type { MeResponse, SessionResponse } from '@domain/auth/auth.schema';

export type SessionUser = MeResponse;

/** A signed-in session. The access token lives in memory only; the refresh token is an httpOnly cookie. */
export type Session = {
  accessToken: string;
  /** Epoch milliseconds at which the server stops accepting `accessToken`. */
  expiresAt: number;
  user: SessionUser;
  /**
   * Opened with no signal for the person last signed in on this device (lib/offline-user.ts): no access
   * token yet. The first request that reaches the server refreshes the session (or ends it).
   */
  offline?: true;
};

/**
 * - `unknown`: the app has just started and has not yet asked the server whether the refresh cookie
 *   still holds a session.
 * - `signed-out`: no session; `reason` says whether one just ended under the user (RequireSession then
 *   sends them to the sign-in page with `expired=1`, so it can explain why they are there).
 */
export type SessionState =
  | { status: 'unknown' }
  | { status: 'signed-in'; session: Session }
  | { status: 'signed-out'; reason: 'signed-out' | 'expired' };

let state: SessionState = { status: 'unknown' };
const listeners = new Set<() => void>();

function publish(next: SessionState): void {
  state = next;
  for (const listener of listeners) listener();
}

export function getSessionState(): SessionState {
  return state;
}

export function getAccessToken(): string | undefined {
  return state.status === 'signed-in' ? state.session.accessToken : undefined;
}

export function getSessionUser(): SessionUser | undefined {
  return state.status === 'signed-in' ? state.session.user : undefined;
}

/** Stores a session the server has just issued (sign-in, refresh, accepted invitation). */
export function setSession(response: SessionResponse, now = Date.now()): Session {
  const session: Session = {
    accessToken: response.accessToken,
    expiresAt: now + response.expiresInSeconds * 1000,
    user: response.user,
  };
  publish({ status: 'signed-in', session });
  return session;
}

/**
 * Opens the app for `user` with no connection to ask the server (see `Session.offline`). The
 * keep-alive and the first 401 refresh it as soon as the server can be reached.
 */
export function startOfflineSession(user: SessionUser): Session {
  const session: Session = { accessToken: '', expiresAt: 0, user, offline: true };
  publish({ status: 'signed-in', session });
  return session;
}

/** Uses a session another tab of this app has just been issued (see session-sync.ts). */
export function adoptSession(session: Session): void {
  publish({ status: 'signed-in', session });
}

/** Forgets the session. `expired` when it ended without the user asking (refresh refused). */
export function clearSession(reason: 'signed-out' | 'expired' = 'signed-out'): void {
  publish({ status: 'signed-out', reason });
}

/** Back to "not yet asked the server": used by tests between renders. */
export function resetSession(): void {
  publish({ status: 'unknown' });
}

export function subscribeSession(listener: () => void): () => void {
  listeners.add(listener);
  return () => listeners.delete(listener);
}

/** The current session state; re-renders when someone signs in, out, or the session is refreshed. */
export function useSessionState(): SessionState {
  return useSyncExternalStore(subscribeSession, getSessionState, getSessionState);
}

/** The signed-in person, or `undefined`. */
export function useSessionUser(): SessionUser | undefined {
  const current = useSessionState();
  return current.status === 'signed-in' ? current.session.user : undefined;
}
