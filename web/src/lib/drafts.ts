import { useCallback, useSyncExternalStore } from 'react';

const PREFIX = 'loamline.draft.';

/*
 * Unsaved form input, kept in localStorage so it survives a reload, a crash or a dropped connection.
 * Keys are per job and section (`job:<id>:run:<runId>`); a draft is removed once the server has it.
 */

const listeners = new Set<() => void>();
const snapshots = new Map<string, { raw: string | null; value: unknown }>();

function notify(): void {
  for (const listener of listeners) listener();
}

function subscribe(listener: () => void): () => void {
  listeners.add(listener);
  // Another tab of the same job keeps this one up to date.
  const onStorage = (event: StorageEvent) => {
    if (event.key === null || event.key.startsWith(PREFIX)) listener();
  };
  window.addEventListener('storage', onStorage);
  return () => {
    listeners.delete(listener);
    window.removeEventListener('storage', onStorage);
  };
}

function rawOf(key: string): string | null {
  try {
    return localStorage.getItem(PREFIX + key);
  } catch {
    return null;
  }
}

/** The stored draft for `key`, or `undefined`. */
export function readDraft<T>(key: string): T | undefined {
  const raw = rawOf(key);
  const cached = snapshots.get(key);
  if (cached && cached.raw === raw) return cached.value as T | undefined;
  let value: unknown;
  if (raw !== null) {
    try {
      value = (JSON.parse(raw) as { value: unknown }).value;
    } catch {
      value = undefined;
    }
  }
  snapshots.set(key, { raw, value });
  return value as T | undefined;
}

export function writeDraft(key: string, value: unknown): void {
  try {
    localStorage.setItem(PREFIX + key, JSON.stringify({ value, savedAt: new Date().toISOString() }));
  } catch {
    // Storage full or disabled: the form still works, only without the safety net.
  }
  notify();
}

export function clearDraft(key: string): void {
  try {
    localStorage.removeItem(PREFIX + key);
  } catch {
    // Nothing to clear.
  }
  notify();
}

/** Keys (without the storage prefix) of every draft starting with `prefix`. */
export function listDraftKeys(prefix: string): string[] {
  const keys: string[] = [];
  try {
    for (let i = 0; i < localStorage.length; i += 1) {
      const key = localStorage.key(i);
      if (key?.startsWith(PREFIX + prefix)) keys.push(key.slice(PREFIX.length));
    }
  } catch {
    return [];
  }
  return keys.sort();
}

/**
 * Form state that is also written to localStorage on every change. `initial` is used while there is
 * no draft; `clear()` drops the draft once it is saved (or discarded).
 */
export function usePersistedDraft<T>(key: string, initial: T): {
  value: T;
  setValue: (next: T | ((current: T) => T)) => void;
  hasDraft: boolean;
  clear: () => void;
} {
  const stored = useSyncExternalStore(
    subscribe,
    () => readDraft<T>(key),
    () => undefined,
  );
  const value = stored ?? initial;
  const setValue = useCallback(
    (next: T | ((current: T) => T)) => {
      const current = readDraft<T>(key) ?? initial;
      writeDraft(key, typeof next === 'function' ? (next as (current: T) => T)(current) : next);
    },
    // `initial` is read only while no draft exists; a fresh object each render must not churn this.
    [key],
  );
  const clear = useCallback(() => clearDraft(key), [key]);
  return { value, setValue, hasDraft: stored !== undefined, clear };
}

/** Re-renders whenever any draft changes; returns the draft keys under `prefix`. */
export function useDraftKeys(prefix: string): string[] {
  const joined = useSyncExternalStore(
    subscribe,
    () => listDraftKeys(prefix).join('\n'),
    () => '',
  );
  return joined === '' ? [] : joined.split('\n');
}
