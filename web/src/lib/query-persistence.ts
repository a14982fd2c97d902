import { dehydrate, type DehydratedState, type QueryClient } from '@tanstack/react-query';
import { persistQueryClientRestore, type PersistedClient, type Persister } from '@tanstack/react-query-persist-client';
import { createStore, del, get, set, type UseStore } from 'idb-keyval';

import { forgetRememberedUser, readRememberedUser, rememberUser } from './offline-user';
import { getSessionState, subscribeSession } from './session';

/**
 * The TanStack Query cache kept in IndexedDB (issue 17), so a job a crew lead opened yesterday opens
 * today in a trench with no signal. The service worker caches no `/api` answer (they are personal);
 * this cache belongs to one signed-in person on this device:
 *
 * - only what the field work needs is kept: jobs (lists, as-built, signatures, packets), their photos
 *   (lists and the small derivatives, not originals), the company's settings and depth rules, the user's
 *   own preferences and the sites behind the jobs (plan images);
 * - the stored copy carries the user's id (`buster`): another person's restore finds nothing, and a
 *   different person signing in wipes it;
 * - signing out deletes it (and the in-memory cache: useSignOut);
 * - a copy older than `PERSIST_MAX_AGE_MS` is dropped on restore.
 */
export const PERSIST_MAX_AGE_MS = 7 * 24 * 60 * 60 * 1000;
const PERSISTED_ROOTS = ['jobs', 'photos', 'company', 'me', 'sites'] as const;
const BUSTER_VERSION = 'v1';
const KEY = 'query-cache';
/** At most one IndexedDB write per this long while the cache changes (typing, refetches). */
const SAVE_THROTTLE_MS = 1_000;

let store: UseStore | undefined;
const cacheStore = () => (store ??= createStore('loamline-cache', 'queries'));

/** Whether `query` is kept on the device (see above). */
export function shouldPersistQuery(query: { queryKey: readonly unknown[]; state: { data?: unknown } }): boolean {
  // Any query with data: a refetch that failed with no signal keeps the data it had (status 'error').
  if (query.state.data === undefined) return false;
  const [root, kind, , variant] = query.queryKey;
  if (!PERSISTED_ROOTS.includes(root as (typeof PERSISTED_ROOTS)[number])) return false;
  // Original photos are large and rarely opened on site; the lists and small derivatives are enough.
  if (root === 'photos' && kind === 'file' && variant === 'original') return false;
  return true;
}

/**
 * The kept copy of a query whose last refetch failed (no signal) is its data, as it was when it last
 * arrived: the failure is not kept, so the next start shows the data and refetches as usual.
 */
function withoutFailures(state: DehydratedState): DehydratedState {
  return {
    ...state,
    queries: state.queries.map((query) =>
      query.state.status === 'error'
        ? { ...query, state: { ...query.state, status: 'success', error: null, fetchFailureReason: null, fetchFailureCount: 0 } }
        : query,
    ),
  };
}

/** `buster` of the copy saved for `userId`: a copy saved for anyone else does not restore. */
export function busterFor(userId: string): string {
  return `${BUSTER_VERSION}:${userId}`;
}

/** A persister over one IndexedDB entry (structured clone: photo Blobs are stored as they are). */
export function createIdbPersister(): Persister {
  return {
    persistClient: (client: PersistedClient) => set(KEY, client, cacheStore()),
    restoreClient: () => get<PersistedClient>(KEY, cacheStore()),
    removeClient: () => del(KEY, cacheStore()),
  };
}

/**
 * Restores the cache saved for the person last signed in here (before the first route loader runs, so
 * a job opens from it with no signal), then keeps saving it while they are signed in, and wipes it on
 * sign-out or when someone else signs in. Never throws: without IndexedDB the app works online.
 */
export async function startQueryPersistence(queryClient: QueryClient, given?: Persister): Promise<() => void> {
  if (!given && typeof indexedDB === 'undefined') return () => undefined;
  const persister = given ?? createIdbPersister();
  // Kept in memory as long as on disk: otherwise a query unused for five minutes would be dropped from
  // memory and then from the saved copy.
  for (const root of PERSISTED_ROOTS) queryClient.setQueryDefaults([root], { gcTime: PERSIST_MAX_AGE_MS });

  const remembered = readRememberedUser();
  if (remembered) {
    try {
      await persistQueryClientRestore({ queryClient, persister, maxAge: PERSIST_MAX_AGE_MS, buster: busterFor(remembered.id) });
      // The kept copy may be up to a save behind the server (a reload right after a change, or another
      // device's change since): every restored query is stale, so what a page shows refetches when it
      // mounts with a signal (the kept data shows meanwhile, and stays when there is none).
      await queryClient.invalidateQueries({ refetchType: 'none' });
    } catch {
      // A damaged copy: start empty (persistQueryClientRestore has removed it).
    }
  }

  let timer: ReturnType<typeof setTimeout> | undefined;
  let generation = 0;
  const save = () => {
    timer = undefined;
    const state = getSessionState();
    if (state.status !== 'signed-in') return;
    const mine = generation;
    const client: PersistedClient = {
      timestamp: Date.now(),
      buster: busterFor(state.session.user.id),
      clientState: withoutFailures(dehydrate(queryClient, { shouldDehydrateQuery: shouldPersistQuery, shouldDehydrateMutation: () => false })),
    };
    // A sign-out between the snapshot and now wins: nothing is written after the wipe.
    if (mine === generation) void Promise.resolve(persister.persistClient(client)).catch(() => undefined);
  };
  const schedule = () => {
    if (timer === undefined) timer = setTimeout(save, SAVE_THROTTLE_MS);
  };
  const wipe = () => {
    generation += 1;
    if (timer !== undefined) clearTimeout(timer);
    timer = undefined;
    void Promise.resolve(persister.removeClient()).catch(() => undefined);
  };

  const unsubscribeCache = queryClient.getQueryCache().subscribe((event) => {
    if (event.type === 'added' || event.type === 'removed' || event.type === 'updated') schedule();
  });
  const onSession = () => {
    const state = getSessionState();
    if (state.status === 'signed-in') {
      const previous = readRememberedUser();
      if (previous && previous.id !== state.session.user.id) {
        // Someone else on this device: nothing of the previous person's stays.
        wipe();
        queryClient.clear();
      }
      rememberUser(state.session.user);
      schedule();
    } else if (state.status === 'signed-out' && state.reason === 'signed-out') {
      forgetRememberedUser();
      wipe();
    }
  };
  const unsubscribeSession = subscribeSession(onSession);
  onSession();
  return () => {
    unsubscribeCache();
    unsubscribeSession();
    if (timer !== undefined) clearTimeout(timer);
  };
}
