import { createStore, del, entries, set, type UseStore } from 'idb-keyval';

import { getSessionUser, subscribeSession } from '../../../lib/session';
import type { JobWrite } from '../api/send-job-write';

/**
 * A job write that could not reach the server yet (issue 17, a field app with no signal), with the job
 * version it was made on. `write.idempotencyKey` was made once, before the first attempt, and goes with
 * every attempt: the server writes the change once even when an answer was lost on the way.
 */
export type PendingWrite = {
  id: string;
  jobId: string;
  /** Whose change it is: only they send it (with their session), and only they see it waiting. */
  userId: string;
  write: JobWrite;
  baseVersion: number;
  queuedAt: string;
  /** Order of queuing on this device (sent in this order). */
  seq: number;
};

/**
 * The queue lives in IndexedDB (`loamline-writes`), so it survives a reload, a crash or a closed tab;
 * a copy in memory answers the screens synchronously. `loadPendingWrites()` fills it at start-up.
 */
const listeners = new Set<() => void>();
let all: PendingWrite[] = [];
let snapshot = new Map<string, PendingWrite[]>();
let loaded: Promise<void> | undefined;
let store: UseStore | undefined;
let lastSeq = 0;

const hasIndexedDb = () => typeof indexedDB !== 'undefined';
const writesStore = () => (store ??= createStore('loamline-writes', 'writes'));
const LEGACY_PREFIX = 'loamline.pending.';

function publish(): void {
  snapshot = new Map();
  for (const listener of listeners) listener();
}

function nextSeq(): number {
  lastSeq = Math.max(lastSeq + 1, Date.now() * 1000);
  return lastSeq;
}

/** A new key for one change (a UUID where the browser has one). */
export function newIdempotencyKey(): string {
  if (typeof crypto !== 'undefined' && typeof crypto.randomUUID === 'function') return crypto.randomUUID();
  return `${Date.now().toString(36)}-${Math.random().toString(36).slice(2)}-${Math.random().toString(36).slice(2)}`;
}

/**
 * Reads the queue from IndexedDB once per page load (main.tsx awaits it before the first render).
 * Writes queued by an earlier version of the app in localStorage are moved over.
 */
export function loadPendingWrites(): Promise<void> {
  loaded ??= (async () => {
    try {
      if (hasIndexedDb()) {
        const stored: PendingWrite[] = [];
        for (const [, value] of await entries<string, PendingWrite | StoredBefore>(writesStore())) {
          const entry = 'endpoint' in value.write ? (value as PendingWrite) : await upgradeStored(value as StoredBefore);
          if (entry) stored.push(entry);
        }
        all = [...all.filter((entry) => !stored.some((s) => s.id === entry.id)), ...stored].sort((a, b) => a.seq - b.seq);
        lastSeq = Math.max(lastSeq, ...all.map((entry) => entry.seq));
      }
      await moveLegacyWrites();
    } catch {
      // IndexedDB refused (private mode, storage cleared): the queue works in memory for this page.
    }
    publish();
  })();
  return loaded;
}

/** A write as kept before it named its endpoint: the HTTP method and a path below the job. */
type WriteBefore = Omit<JobWrite, 'endpoint' | 'params' | 'body'> & { method: string; path: string; body?: unknown };
type StoredBefore = Omit<PendingWrite, 'write'> & { write: WriteBefore };

/**
 * The endpoint and parameters of a write kept as a path, or undefined when the path is not one of ours.
 * The reader of old paths (with every job write's schema) is loaded only when such an entry is found,
 * so the start-up code that reads the queue on every page stays small.
 */
async function writeFrom(before: WriteBefore): Promise<JobWrite | undefined> {
  const { callFromLegacyPath } = await import('../api/job-write-endpoints');
  const call = callFromLegacyPath(before.method, before.path, before.body);
  if (!call) return undefined;
  return { ...call, label: before.label, ...(before.draftKey ? { draftKey: before.draftKey } : {}), ...(before.idempotencyKey ? { idempotencyKey: before.idempotencyKey } : {}) };
}

/**
 * Rewrites an entry the previous app kept as a path, keeping its key and place in line; an entry whose
 * path names no endpoint stays stored (nothing is silently dropped) but is not sent.
 */
async function upgradeStored(before: StoredBefore): Promise<PendingWrite | undefined> {
  const write = await writeFrom(before.write);
  if (!write) return undefined;
  const upgraded: PendingWrite = { ...before, write };
  await set(upgraded.id, upgraded, writesStore()).catch(() => undefined);
  return upgraded;
}

async function moveLegacyWrites(): Promise<void> {
  const user = getSessionUser();
  let keys: string[] = [];
  try {
    keys = Object.keys(localStorage).filter((key) => key.startsWith(LEGACY_PREFIX));
  } catch {
    return;
  }
  for (const key of keys) {
    const jobId = key.slice(LEGACY_PREFIX.length);
    try {
      const legacy = JSON.parse(localStorage.getItem(key) ?? '[]') as { id: string; write: WriteBefore; baseVersion: number; queuedAt: string }[];
      const writes = await Promise.all(legacy.map((entry) => writeFrom(entry.write)));
      if (writes.some((write) => !write)) continue; // Unreadable: left where it is.
      for (const [index, entry] of legacy.entries()) {
        const write = writes[index]!;
        const moved: PendingWrite = { ...entry, jobId, userId: user?.id ?? '', seq: nextSeq(), write: { ...write, idempotencyKey: newIdempotencyKey() } };
        all.push(moved);
        if (hasIndexedDb()) await set(moved.id, moved, writesStore());
      }
      localStorage.removeItem(key);
    } catch {
      // Unreadable: left where it is.
    }
  }
}

function mine(entry: PendingWrite, userId: string | undefined): boolean {
  // Entries moved from localStorage before anyone was known belong to whoever signs in first.
  return entry.userId === '' || entry.userId === userId;
}

/** This job's writes waiting for a connection, oldest first (the same array until the queue changes). */
export function readPendingWrites(jobId: string): PendingWrite[] {
  const userId = getSessionUser()?.id;
  const cacheKey = `${userId ?? ''}|${jobId}`;
  let value = snapshot.get(cacheKey);
  if (!value) {
    value = all.filter((entry) => entry.jobId === jobId && mine(entry, userId));
    snapshot.set(cacheKey, value);
  }
  return value;
}

/** Every write of the signed-in person waiting on this device, oldest first (the indicator). */
export function readAllPendingWrites(): PendingWrite[] {
  const userId = getSessionUser()?.id;
  const cacheKey = `${userId ?? ''}|*`;
  let value = snapshot.get(cacheKey);
  if (!value) {
    value = userId ? all.filter((entry) => mine(entry, userId)) : [];
    snapshot.set(cacheKey, value);
  }
  return value;
}

/**
 * Queues `write` (which must carry its idempotency key) and resolves once it is stored durably, so a
 * "kept on this device" message is true when it shows.
 */
export async function enqueuePendingWrite(jobId: string, write: JobWrite, baseVersion: number): Promise<PendingWrite> {
  const entry: PendingWrite = {
    id: `${Date.now().toString(36)}-${Math.random().toString(36).slice(2, 10)}`,
    jobId,
    userId: getSessionUser()?.id ?? '',
    write: { ...write, idempotencyKey: write.idempotencyKey ?? newIdempotencyKey() },
    baseVersion,
    queuedAt: new Date().toISOString(),
    seq: nextSeq(),
  };
  all = [...all, entry];
  publish();
  if (hasIndexedDb()) {
    try {
      await set(entry.id, entry, writesStore());
    } catch {
      // Stored in memory only for this page; the form's draft still holds the input.
    }
  }
  return entry;
}

/**
 * Rewrites `jobId`'s waiting writes, kept durably (the ids of records made with no signal become the
 * server's once it has named them, so a crash mid-replay leaves nothing pointing at a made-up id).
 */
export async function rewritePendingWrites(jobId: string, rewrite: (write: JobWrite) => JobWrite): Promise<void> {
  const changed: PendingWrite[] = [];
  all = all.map((entry) => {
    if (entry.jobId !== jobId) return entry;
    const write = rewrite(entry.write);
    if (write === entry.write) return entry;
    const next = { ...entry, write };
    changed.push(next);
    return next;
  });
  if (changed.length === 0) return;
  publish();
  if (hasIndexedDb()) await Promise.all(changed.map((entry) => set(entry.id, entry, writesStore()).catch(() => undefined)));
}

export async function removePendingWrite(jobId: string, id: string): Promise<void> {
  all = all.filter((entry) => !(entry.jobId === jobId && entry.id === id));
  publish();
  if (hasIndexedDb()) await del(id, writesStore()).catch(() => undefined);
}

/** Calls `listener` when the queue changes or someone else signs in (whose queue is another). */
export function subscribePendingWrites(listener: () => void): () => void {
  listeners.add(listener);
  const unsubscribeSession = subscribeSession(listener);
  return () => {
    listeners.delete(listener);
    unsubscribeSession();
  };
}

/** Tests: forget the in-memory queue and what was loaded. */
export function resetPendingWritesForTests(): void {
  all = [];
  loaded = undefined;
  lastSeq = 0;
  publish();
}
