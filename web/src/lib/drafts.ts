import { useCallback, useEffect, useRef, useSyncExternalStore } from 'react';
import { useForm, type DefaultValues, type FieldValues, type Resolver, type UseFormReturn } from 'react-hook-form';

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
  // `initial` is read only while no draft exists, and callers pass a fresh object each render: keep the
  // latest in a ref so setValue stays the same function for as long as the key does.
  const initialRef = useRef(initial);
  useEffect(() => {
    initialRef.current = initial;
  });
  const setValue = useCallback(
    (next: T | ((current: T) => T)) => {
      const current = readDraft<T>(key) ?? initialRef.current;
      writeDraft(key, typeof next === 'function' ? (next as (current: T) => T)(current) : next);
    },
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

/**
 * A react-hook-form form whose values are also a persisted draft: restored as the default values,
 * written on every change, and dropped (the form showing `initial` again) when the draft is cleared —
 * by `clear()`, by the job writer once the server has the change, or in another tab.
 */
export function useDraftForm<TForm extends FieldValues, TOutput = TForm>(
  key: string,
  initial: TForm,
  resolver?: Resolver<TForm, unknown, TOutput>,
): { form: UseFormReturn<TForm, unknown, TOutput>; hasDraft: boolean; clear: () => void } {
  const stored = useSyncExternalStore(
    subscribe,
    () => readDraft<TForm>(key),
    () => undefined,
  );
  const form = useForm<TForm, unknown, TOutput>({
    defaultValues: (readDraft<TForm>(key) ?? initial) as DefaultValues<TForm>,
    ...(resolver ? { resolver } : {}),
  });
  const initialRef = useRef(initial);
  initialRef.current = initial;
  // Resetting the form is not an edit: it must not write the draft back.
  const isResetting = useRef(false);

  const resetTo = useCallback(
    (values: TForm) => {
      isResetting.current = true;
      try {
        form.reset(values);
      } finally {
        isResetting.current = false;
      }
    },
    [form],
  );

  useEffect(() => {
    const subscription = form.watch((values, info) => {
      // Only an edit makes a draft: a reset (after Save, after Discard) reports no field name and may
      // arrive after `isResetting` is back to false, which used to write the draft straight back.
      if (isResetting.current || info.name === undefined) return;
      // Typed back to what the record holds: nothing left to save.
      if (JSON.stringify(values) === JSON.stringify(initialRef.current)) clearDraft(key);
      else writeDraft(key, values);
    });
    return () => subscription.unsubscribe();
  }, [form, key]);

  // The draft went away elsewhere (saved, discarded, another tab): show the record as it is now.
  const hadDraft = useRef(stored !== undefined);
  useEffect(() => {
    if (hadDraft.current && stored === undefined) resetTo(initialRef.current);
    hadDraft.current = stored !== undefined;
  }, [resetTo, stored]);

  // Without a draft the form shows the record: follow it when it changes (someone else saved).
  const initialJson = JSON.stringify(initial);
  const shownJson = useRef(initialJson);
  useEffect(() => {
    if (shownJson.current === initialJson) return;
    shownJson.current = initialJson;
    if (readDraft(key) === undefined) resetTo(initialRef.current);
  }, [initialJson, key, resetTo]);

  const clear = useCallback(() => {
    clearDraft(key);
    resetTo(initialRef.current);
  }, [key, resetTo]);

  return { form, hasDraft: stored !== undefined, clear };
}
