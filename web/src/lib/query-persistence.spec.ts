import type { PersistedClient, Persister } from '@tanstack/react-query-persist-client';
import { dehydrate } from '@tanstack/react-query';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';

import { buildSessionResponse, buildSessionUser } from '../testing/data';

import { readRememberedUser } from './offline-user';
import { createQueryClient } from './query-client';
import { busterFor, shouldPersistQuery, startQueryPersistence } from './query-persistence';
import { clearSession, resetSession, setSession } from './session';

/** One stored copy, as IndexedDB would keep it. */
function memoryPersister() {
  let stored: PersistedClient | undefined;
  const persister: Persister = {
    persistClient: vi.fn((client: PersistedClient) => {
      stored = structuredClone(client);
    }),
    restoreClient: () => stored,
    removeClient: vi.fn(() => {
      stored = undefined;
    }),
  };
  return { persister, stored: () => stored };
}

const lead = buildSessionUser('lead');
const office = buildSessionUser('office');
const JOB_KEY = ['jobs', 'detail', 'job-1', 'as-built'];

describe('query cache kept on the device (issue 17)', () => {
  const stops: (() => void)[] = [];

  beforeEach(() => {
    vi.useFakeTimers();
    localStorage.clear();
    resetSession();
  });
  afterEach(() => {
    for (const stop of stops.splice(0)) stop();
    vi.useRealTimers();
    resetSession();
  });

  it('should keep the field work (jobs, photo lists, settings) and nothing else, never queries without data or original photos', () => {
    const ok = (queryKey: unknown[]) => ({ queryKey, state: { data: { any: 'data' } } });
    expect(shouldPersistQuery(ok(JOB_KEY))).toBe(true);
    expect(shouldPersistQuery(ok(['jobs', 'list', {}]))).toBe(true);
    expect(shouldPersistQuery(ok(['photos', 'list', 'job-1']))).toBe(true);
    expect(shouldPersistQuery(ok(['photos', 'file', 'p1', 'thumbnail']))).toBe(true);
    expect(shouldPersistQuery(ok(['photos', 'file', 'p1', 'original']))).toBe(false);
    expect(shouldPersistQuery(ok(['company', 'settings']))).toBe(true);
    for (const key of [['outbox', 'list', { page: 1 }], ['users', 'list'], ['customers', 'list', {}], ['portal', 'sites'], ['locate', 't']]) {
      expect(shouldPersistQuery(ok(key)), JSON.stringify(key)).toBe(false);
    }
    expect(shouldPersistQuery({ queryKey: JOB_KEY, state: { data: undefined } })).toBe(false);
  });

  it('should save the signed-in lead’s jobs under their id, restore them into a new tab, and wipe them on sign-out', async () => {
    const { persister, stored } = memoryPersister();
    const first = createQueryClient();
    stops.push(await startQueryPersistence(first, persister));
    setSession(buildSessionResponse(lead));
    first.setQueryData(JOB_KEY, { job: { version: 4 } });
    first.setQueryData(['outbox', 'list', { page: 1 }], { items: ['a message'] });
    await vi.advanceTimersByTimeAsync(1_100);

    expect(stored()?.buster).toBe(busterFor(lead.id));
    expect(stored()?.clientState.queries.map((query) => query.queryKey)).toEqual([JOB_KEY]);
    expect(readRememberedUser()?.id).toBe(lead.id);

    // A reload with no signal: the app starts, nobody is signed in yet, the cache comes back.
    stops.pop()?.();
    resetSession();
    const second = createQueryClient();
    stops.push(await startQueryPersistence(second, persister));
    expect(second.getQueryData(JOB_KEY)).toEqual({ job: { version: 4 } });
    // The kept copy may be behind the server (saved up to a second late): it is stale, so the page
    // refetches it when it mounts, even within the client's staleTime of the save.
    expect(second.getQueryState(JOB_KEY)?.isInvalidated).toBe(true);
    // Kept in memory as long as on disk, not five minutes.
    expect(second.getQueryCache().find({ queryKey: JOB_KEY })?.gcTime).toBe(7 * 24 * 60 * 60 * 1000);

    setSession(buildSessionResponse(lead));
    clearSession('signed-out');
    expect(persister.removeClient).toHaveBeenCalled();
    expect(stored()).toBeUndefined();
    expect(readRememberedUser()).toBeUndefined();
    second.setQueryData(JOB_KEY, { job: { version: 5 } });
    await vi.advanceTimersByTimeAsync(1_100);
    expect(stored(), 'nothing is written while signed out').toBeUndefined();
  });

  it('should not restore one person’s copy for another, and wipe it when someone else signs in', async () => {
    const { persister, stored } = memoryPersister();
    const first = createQueryClient();
    stops.push(await startQueryPersistence(first, persister));
    setSession(buildSessionResponse(lead));
    first.setQueryData(JOB_KEY, { job: { version: 4 } });
    await vi.advanceTimersByTimeAsync(1_100);
    expect(stored()).toBeDefined();

    // The session ended on its own (not a sign-out); the office signs in on the same phone.
    clearSession('expired');
    setSession(buildSessionResponse(office));
    expect(first.getQueryData(JOB_KEY), 'the lead’s jobs leave memory').toBeUndefined();
    await vi.advanceTimersByTimeAsync(1_100);
    expect(stored()?.buster).toBe(busterFor(office.id));
    expect(stored()?.clientState.queries).toEqual([]);
    expect(readRememberedUser()?.id).toBe(office.id);

    // A copy saved for someone else does not restore.
    stops.pop()?.();
    localStorage.setItem('loamline.offline-user', JSON.stringify(lead));
    const { persister: other } = memoryPersister();
    const foreign = createQueryClient();
    foreign.setQueryData(JOB_KEY, { job: { version: 9 } });
    await other.persistClient({ timestamp: Date.now(), buster: busterFor(office.id), clientState: dehydrate(foreign) });
    resetSession();
    const third = createQueryClient();
    stops.push(await startQueryPersistence(third, other));
    expect(third.getQueryData(JOB_KEY)).toBeUndefined();
  });
});
