import type { JobWrite } from '../api/send-job-write';

/** A write that could not reach the server yet, with the job version it was made on. */
export type PendingWrite = { id: string; write: JobWrite; baseVersion: number; queuedAt: string };

const PREFIX = 'loamline.pending.';
const listeners = new Set<() => void>();
const cache = new Map<string, { raw: string | null; value: PendingWrite[] }>();

function raw(jobId: string): string | null {
  try {
    return localStorage.getItem(PREFIX + jobId);
  } catch {
    return null;
  }
}

/** Writes waiting for a connection, oldest first. */
export function readPendingWrites(jobId: string): PendingWrite[] {
  const current = raw(jobId);
  const cached = cache.get(jobId);
  if (cached && cached.raw === current) return cached.value;
  let value: PendingWrite[] = [];
  try {
    value = current ? (JSON.parse(current) as PendingWrite[]) : [];
  } catch {
    value = [];
  }
  cache.set(jobId, { raw: current, value });
  return value;
}

function store(jobId: string, writes: PendingWrite[]): void {
  try {
    if (writes.length === 0) localStorage.removeItem(PREFIX + jobId);
    else localStorage.setItem(PREFIX + jobId, JSON.stringify(writes));
  } catch {
    // Storage unavailable: the write stays only in the form's draft.
  }
  for (const listener of listeners) listener();
}

export function enqueuePendingWrite(jobId: string, write: JobWrite, baseVersion: number): void {
  const id = `${Date.now().toString(36)}-${Math.random().toString(36).slice(2, 8)}`;
  store(jobId, [...readPendingWrites(jobId), { id, write, baseVersion, queuedAt: new Date().toISOString() }]);
}

export function removePendingWrite(jobId: string, id: string): void {
  store(jobId, readPendingWrites(jobId).filter((entry) => entry.id !== id));
}

export function subscribePendingWrites(listener: () => void): () => void {
  listeners.add(listener);
  return () => listeners.delete(listener);
}
