import { useCallback, useSyncExternalStore } from 'react';

import type { UnitPreferences } from './units';

const STORAGE_KEY = 'loamline.units';

/**
 * The API has no company or user unit settings yet, so the choice is kept per browser. US crews are
 * the first users: feet/inches and AWG unless the browser's language says otherwise.
 */
export function defaultUnitPreferences(language = typeof navigator === 'undefined' ? 'en-US' : navigator.language): UnitPreferences {
  const isUs = /^en-(US|LR)|^my\b/i.test(language) || language === 'en';
  return isUs ? { length: 'imperial', gauge: 'awg' } : { length: 'metric', gauge: 'mm2' };
}

const listeners = new Set<() => void>();
let cached: { raw: string | null; value: UnitPreferences } | undefined;

function read(): UnitPreferences {
  const raw = safeGet();
  if (cached && cached.raw === raw) return cached.value;
  let value = defaultUnitPreferences();
  if (raw) {
    try {
      const parsed = JSON.parse(raw) as Partial<UnitPreferences>;
      value = {
        length: parsed.length === 'metric' || parsed.length === 'imperial' ? parsed.length : value.length,
        gauge: parsed.gauge === 'awg' || parsed.gauge === 'mm2' ? parsed.gauge : value.gauge,
      };
    } catch {
      // A damaged entry falls back to the default.
    }
  }
  cached = { raw, value };
  return value;
}

function safeGet(): string | null {
  try {
    return localStorage.getItem(STORAGE_KEY);
  } catch {
    return null;
  }
}

export function setUnitPreferences(next: UnitPreferences): void {
  try {
    localStorage.setItem(STORAGE_KEY, JSON.stringify(next));
  } catch {
    // Private mode: the choice lasts for this page only.
  }
  cached = { raw: JSON.stringify(next), value: next };
  for (const listener of listeners) listener();
}

function subscribe(listener: () => void): () => void {
  listeners.add(listener);
  return () => listeners.delete(listener);
}

/** The signed-in person's unit choice on this device, and a setter. */
export function useUnitPreferences(): [UnitPreferences, (next: UnitPreferences) => void] {
  const value = useSyncExternalStore(subscribe, read, read);
  const set = useCallback((next: UnitPreferences) => setUnitPreferences(next), []);
  return [value, set];
}
