import { adoptSession, clearSession, getSessionState, type Session } from './session';

/**
 * Coordinates the session between tabs of this app (same origin, same browser profile).
 *
 * Every tab shares one refresh cookie, and the server rotates it on each use. Tabs opened together (a
 * browser restoring its session) would each spend the same cookie at once; the server answers those
 * within a short grace window with one successor, but the tabs should not race in the first place. So:
 *
 * - a refresh runs under the Web Lock `loamline-refresh`, one tab at a time across the browser;
 * - the tab that refreshes tells the others on the BroadcastChannel `loamline-session` ("refreshing",
 *   then the new session or "failed"), and a tab that waited for the lock uses that result instead of
 *   refreshing again;
 * - signing out in one tab signs out the others (the server ended the cookie they share).
 *
 * Without Web Locks or BroadcastChannel (old browsers, tests) each falls back to doing the work alone:
 * correct, since the cookie jar is shared and the server's grace window covers a simultaneous refresh.
 */

export const REFRESH_LOCK = 'loamline-refresh';
export const SESSION_CHANNEL = 'loamline-session';

/** How long a tab that saw another tab start refreshing waits for its result before refreshing itself. */
const PEER_RESULT_WAIT_MS = 1_000;
/** A session adopted from another tab is used only with at least this much access-token life left. */
const MIN_ADOPTED_LIFETIME_MS = 10_000;

type SyncMessage =
  | { type: 'refreshing'; id: string }
  | { type: 'refreshed'; id: string; session: Session }
  | { type: 'refresh-failed'; id: string }
  | { type: 'signed-out' };

let channel: BroadcastChannel | null | undefined;
/** Refreshes other tabs have announced and not yet concluded, with who waits for their outcome. */
const peerRefreshes = new Map<string, Set<() => void>>();

function isSession(value: unknown): value is Session {
  const s = value as Session | undefined;
  return !!s && typeof s.accessToken === 'string' && typeof s.expiresAt === 'number' && typeof s.user?.id === 'string';
}

function onMessage(event: MessageEvent<unknown>): void {
  const message = event.data as SyncMessage | undefined;
  if (!message || typeof message !== 'object') return;
  if (message.type === 'refreshing') {
    if (!peerRefreshes.has(message.id)) peerRefreshes.set(message.id, new Set());
    return;
  }
  if (message.type === 'refreshed' || message.type === 'refresh-failed') {
    if (message.type === 'refreshed' && isSession(message.session)) {
      // The shared cookie now belongs to that session. A tab signed in as someone else keeps its own
      // (its next refresh will tell it the truth).
      const state = getSessionState();
      if (state.status !== 'signed-in' || state.session.user.id === message.session.user.id) adoptSession(message.session);
    }
    const waiters = peerRefreshes.get(message.id);
    peerRefreshes.delete(message.id);
    for (const wake of waiters ?? []) wake();
    return;
  }
  if (message.type === 'signed-out' && getSessionState().status === 'signed-in') clearSession('signed-out');
}

function sessionChannel(): BroadcastChannel | null {
  if (channel === undefined) {
    channel = typeof BroadcastChannel === 'undefined' ? null : new BroadcastChannel(SESSION_CHANNEL);
    channel?.addEventListener('message', onMessage);
    // Node (tests) keeps its process alive for an open channel; browsers have no such method.
    (channel as { unref?: () => void } | null)?.unref?.();
  }
  return channel;
}

function post(message: SyncMessage): void {
  try {
    sessionChannel()?.postMessage(message);
  } catch {
    // A closed channel (page unloading): the other tabs simply refresh for themselves.
  }
}

/** Listen to the other tabs from the start (a tab that only waits must hear their results). */
export function startSessionSync(): void {
  sessionChannel();
}

/** Tells the other tabs this one signed out. */
export function announceSignedOut(): void {
  post({ type: 'signed-out' });
}

/** Waits (bounded) until every refresh another tab announced has concluded. */
async function peerResults(): Promise<void> {
  if (peerRefreshes.size === 0) return;
  await Promise.race([
    Promise.all([...peerRefreshes.values()].map((waiters) => new Promise<void>((resolve) => waiters.add(resolve)))),
    new Promise<void>((resolve) => setTimeout(resolve, PEER_RESULT_WAIT_MS)),
  ]);
}

function freshSessionOtherThan(accessTokenBefore: string | undefined): Session | undefined {
  const state = getSessionState();
  if (state.status !== 'signed-in') return undefined;
  const { session } = state;
  return session.accessToken !== accessTokenBefore && session.expiresAt - Date.now() > MIN_ADOPTED_LIFETIME_MS ? session : undefined;
}

/**
 * Runs `refresh` as the only refresh across tabs, unless another tab's refresh (finished while this one
 * waited) already produced a usable session: then that session is returned and `refresh` never runs.
 * `accessTokenBefore` is the token this tab held when it decided to refresh.
 */
export async function refreshAcrossTabs(
  accessTokenBefore: string | undefined,
  refresh: () => Promise<Session | null>,
): Promise<Session | null> {
  sessionChannel();
  const locks = typeof navigator === 'undefined' ? undefined : navigator.locks;
  const run = async (): Promise<Session | null> => {
    await peerResults();
    const adopted = freshSessionOtherThan(accessTokenBefore);
    if (adopted) return adopted;
    const id = `${Date.now().toString(36)}-${Math.random().toString(36).slice(2)}`;
    post({ type: 'refreshing', id });
    let session: Session | null = null;
    try {
      session = await refresh();
    } finally {
      post(session ? { type: 'refreshed', id, session } : { type: 'refresh-failed', id });
    }
    return session;
  };
  if (!locks?.request) return run();
  return locks.request(REFRESH_LOCK, { mode: 'exclusive' }, run) as Promise<Session | null>;
}

/** Forgets the channel and what it heard: for tests. */
export function resetSessionSync(): void {
  channel?.close();
  channel = undefined;
  peerRefreshes.clear();
}
