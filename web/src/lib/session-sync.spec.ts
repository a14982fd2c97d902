import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';

import { buildSessionResponse, buildSessionUser } from '../testing/data';
import { mockApi } from '../testing/mock-api';
import { jsonResponse } from '../testing/render-app';

import { refreshSession } from './api-client';
import { getAccessToken, getSessionState, resetSession, setSession, type Session } from './session';
import { announceSignedOut, REFRESH_LOCK, refreshAcrossTabs, resetSessionSync, SESSION_CHANNEL, startSessionSync } from './session-sync';

/** Web Locks as one browser gives them to all its tabs: exclusive requests run one after another. */
function installLocks() {
  let tail: Promise<unknown> = Promise.resolve();
  const locks = {
    request: vi.fn((_name: string, _options: unknown, callback: () => Promise<unknown>) => {
      const run = tail.then(() => callback());
      tail = run.catch(() => undefined);
      return run;
    }),
  };
  Object.defineProperty(navigator, 'locks', { value: locks, configurable: true });
  return locks;
}

const user = buildSessionUser('lead');
const sessionWith = (accessToken: string): Session => ({ accessToken, expiresAt: Date.now() + 900_000, user });

/** Resolves once `predicate` holds, polling the event loop (channel messages arrive as tasks). */
async function until(predicate: () => boolean): Promise<void> {
  for (let i = 0; i < 200 && !predicate(); i++) await new Promise((resolve) => setTimeout(resolve, 5));
  expect(predicate()).toBe(true);
}

describe('session sync across tabs', () => {
  /** Another tab of the app: its own end of the channel. */
  let otherTab: BroadcastChannel;
  let heardFromThisTab: unknown[];

  beforeEach(() => {
    resetSession();
    resetSessionSync();
    startSessionSync();
    otherTab = new BroadcastChannel(SESSION_CHANNEL);
    heardFromThisTab = [];
    otherTab.onmessage = (event: MessageEvent) => heardFromThisTab.push(event.data);
  });

  afterEach(() => {
    otherTab.close();
    resetSessionSync();
    Reflect.deleteProperty(navigator, 'locks');
  });

  it("should wait for another tab's refresh and use its session instead of spending the cookie again", async () => {
    const locks = installLocks();
    const fetchMock = mockApi({ 'POST /api/auth/refresh': () => jsonResponse(buildSessionResponse(user, 'mine')) });
    let release!: () => void;
    const peerHolds = locks.request(REFRESH_LOCK, { mode: 'exclusive' }, async () => {
      otherTab.postMessage({ type: 'refreshing', id: 'peer-1' });
      await new Promise<void>((resolve) => (release = resolve));
    });
    await until(() => release !== undefined);
    // Let this tab hear that the other one is refreshing.
    await new Promise((resolve) => setTimeout(resolve, 20));

    const mine = refreshSession();
    otherTab.postMessage({ type: 'refreshed', id: 'peer-1', session: sessionWith('from-the-other-tab') });
    release();
    await peerHolds;

    expect((await mine)?.accessToken).toBe('from-the-other-tab');
    expect(getAccessToken()).toBe('from-the-other-tab');
    expect(fetchMock.mock.calls.filter(([url]) => url === '/api/auth/refresh')).toHaveLength(0);
    // Both went through the one lock.
    expect(locks.request).toHaveBeenCalledTimes(2);
  });

  it('should refresh itself, under the lock, when the other tab could not', async () => {
    const locks = installLocks();
    const fetchMock = mockApi({ 'POST /api/auth/refresh': () => jsonResponse(buildSessionResponse(user, 'mine')) });
    let release!: () => void;
    const peerHolds = locks.request(REFRESH_LOCK, { mode: 'exclusive' }, async () => {
      otherTab.postMessage({ type: 'refreshing', id: 'peer-2' });
      await new Promise<void>((resolve) => (release = resolve));
    });
    await until(() => release !== undefined);
    await new Promise((resolve) => setTimeout(resolve, 20));

    const mine = refreshSession();
    otherTab.postMessage({ type: 'refresh-failed', id: 'peer-2' });
    release();
    await peerHolds;

    expect((await mine)?.accessToken).toBe('mine');
    expect(fetchMock.mock.calls.filter(([url]) => url === '/api/auth/refresh')).toHaveLength(1);
    // …and tells the other tabs what it got.
    await until(() => heardFromThisTab.some((m) => (m as { type: string }).type === 'refreshed'));
    expect(heardFromThisTab.map((m) => (m as { type: string }).type)).toEqual(['refreshing', 'refreshed']);
    expect((heardFromThisTab[1] as { session: Session }).session.accessToken).toBe('mine');
  });

  it('should run one refresh when two callers ask at once, the second using the first one’s result', async () => {
    installLocks();
    const first = vi.fn(async () => setSession(buildSessionResponse(user, 'first')));
    const second = vi.fn(async () => setSession(buildSessionResponse(user, 'second')));

    const [a, b] = await Promise.all([refreshAcrossTabs(undefined, first), refreshAcrossTabs(undefined, second)]);

    expect(first).toHaveBeenCalledTimes(1);
    expect(second).not.toHaveBeenCalled();
    expect(a?.accessToken).toBe('first');
    expect(b?.accessToken).toBe('first');
  });

  it('should refresh alone where the browser has no Web Locks', async () => {
    const refresh = vi.fn(async () => setSession(buildSessionResponse(user, 'alone')));
    expect((await refreshAcrossTabs(undefined, refresh))?.accessToken).toBe('alone');
    expect(refresh).toHaveBeenCalledTimes(1);
  });

  it('should sign this tab out when another tab signs out, and tell the others when this one does', async () => {
    setSession(buildSessionResponse(user, 'token'));
    otherTab.postMessage({ type: 'signed-out' });
    await until(() => getSessionState().status === 'signed-out');
    expect(getSessionState()).toEqual({ status: 'signed-out', reason: 'signed-out' });

    announceSignedOut();
    await until(() => heardFromThisTab.length === 1);
    expect(heardFromThisTab).toEqual([{ type: 'signed-out' }]);
  });

  it("should not switch to another person's session announced by another tab", async () => {
    setSession(buildSessionResponse(user, 'lead-token'));
    const someoneElse = { ...sessionWith('office-token'), user: buildSessionUser('office') };
    otherTab.postMessage({ type: 'refreshed', id: 'peer-3', session: someoneElse });
    otherTab.postMessage({ type: 'refreshed', id: 'peer-4', session: sessionWith('lead-token-2') });
    await until(() => getAccessToken() === 'lead-token-2');
  });
});
