import { queryOptions, useQuery, useQueryClient, type QueryClient } from '@tanstack/react-query';
import { useCallback, useEffect, useSyncExternalStore } from 'react';
import {
  GAUGE_UNITS,
  LENGTH_UNITS,
  type GaugeUnits,
  type LengthUnits,
  type MyPreferencesResponse,
  MyPreferencesResponseSchema,
  type UpdateMyPreferencesInput,
} from '@domain/settings/settings.schema';

import { apiRequest, isApiError } from './api-client';
import { getSessionUser, useSessionUser } from './session';
import type { UnitPreferences } from './units';

/**
 * The last units this device showed, so the app opens in them offline and before the server answers:
 * `{ length, gauge }` plus, for a choice the server has not stored yet, `own` (`null` = the company's
 * default). An entry without `synced` is such a pending choice; one written by an older version of the
 * app (a choice made per device) is sent to the account the first time someone signs in here.
 */
const STORAGE_KEY = 'loamline.units';

type OwnChoice = { lengthUnits: LengthUnits | null; gaugeUnits: GaugeUnits | null };
/** `userId`: whose pending choice it is, so that the next person to sign in on this device does not inherit it. */
type Stored = UnitPreferences & { synced?: boolean; own?: OwnChoice; userId?: string };

/**
 * Before the server has answered, and for people signed out (the locate view): feet/inches and AWG on
 * a US browser, metres and mm² elsewhere.
 */
export function defaultUnitPreferences(language = typeof navigator === 'undefined' ? 'en-US' : navigator.language): UnitPreferences {
  const isUs = /^en-(US|LR)|^my\b/i.test(language) || language === 'en';
  return isUs ? { length: 'imperial', gauge: 'awg' } : { length: 'metric', gauge: 'mm2' };
}

const listeners = new Set<() => void>();
let cached: { raw: string | null; value: Stored | undefined } | undefined;

function isLength(value: unknown): value is LengthUnits {
  return (LENGTH_UNITS as readonly unknown[]).includes(value);
}

function isGauge(value: unknown): value is GaugeUnits {
  return (GAUGE_UNITS as readonly unknown[]).includes(value);
}

function readStored(): Stored | undefined {
  let raw: string | null = null;
  try {
    raw = localStorage.getItem(STORAGE_KEY);
  } catch {
    // Private mode: nothing stored.
  }
  if (cached && cached.raw === raw) return cached.value;
  let value: Stored | undefined;
  if (raw) {
    try {
      const parsed = JSON.parse(raw) as Partial<Stored>;
      if (isLength(parsed.length) && isGauge(parsed.gauge)) {
        const own = parsed.own;
        value = {
          length: parsed.length,
          gauge: parsed.gauge,
          ...(parsed.synced === true ? { synced: true } : {}),
          ...(typeof parsed.userId === 'string' ? { userId: parsed.userId } : {}),
          ...(own && (own.lengthUnits === null || isLength(own.lengthUnits)) && (own.gaugeUnits === null || isGauge(own.gaugeUnits))
            ? { own: { lengthUnits: own.lengthUnits, gaugeUnits: own.gaugeUnits } }
            : {}),
        };
      }
    } catch {
      // A damaged entry is ignored.
    }
  }
  cached = { raw, value };
  return value;
}

function writeStored(next: Stored): void {
  const raw = JSON.stringify(next);
  try {
    localStorage.setItem(STORAGE_KEY, raw);
  } catch {
    // Private mode: the value lasts for this page only.
  }
  cached = { raw, value: next };
  for (const listener of listeners) listener();
}

function subscribe(listener: () => void): () => void {
  listeners.add(listener);
  return () => listeners.delete(listener);
}

export function getMyPreferences({ signal }: { signal?: AbortSignal } = {}): Promise<MyPreferencesResponse> {
  return apiRequest('/api/me/preferences', MyPreferencesResponseSchema, { signal });
}

export function updateMyPreferences(input: UpdateMyPreferencesInput): Promise<MyPreferencesResponse> {
  return apiRequest('/api/me/preferences', MyPreferencesResponseSchema, { method: 'PATCH', body: input });
}

/** The signed-in person's unit choices, the company's defaults and what the app shows (`effective`). */
export function getMyPreferencesQueryOptions() {
  return queryOptions({
    queryKey: ['me', 'preferences'],
    queryFn: ({ signal }) => getMyPreferences({ signal }),
    staleTime: 5 * 60_000,
  });
}

let syncing: Promise<void> | undefined;

/**
 * Sends a choice made while the server could not be reached (or made per device by an older version)
 * to the account. A refusal (4xx) drops it; no connection keeps it for the next try.
 */
function syncPending(queryClient: QueryClient): Promise<void> {
  if (syncing) return syncing;
  const started = readStored();
  syncing = (async () => {
    const stored = started;
    if (!stored || stored.synced) return;
    if (stored.userId !== undefined && stored.userId !== getSessionUser()?.id) {
      writeStored({ length: stored.length, gauge: stored.gauge, synced: true });
      return;
    }
    const own = stored.own ?? { lengthUnits: stored.length, gaugeUnits: stored.gauge };
    // A read already on its way answers with the units from before this choice: drop it.
    await queryClient.cancelQueries({ queryKey: getMyPreferencesQueryOptions().queryKey });
    try {
      const answer = await updateMyPreferences(own);
      queryClient.setQueryData(getMyPreferencesQueryOptions().queryKey, answer);
      // Only if nothing newer was chosen meanwhile.
      if (readStored() === stored) writeStored({ ...answer.effective, synced: true });
    } catch (error) {
      if (isApiError(error) && error.status >= 400 && error.status < 500) writeStored({ length: stored.length, gauge: stored.gauge, synced: true });
    }
  })().finally(() => {
    syncing = undefined;
    // Chosen again while this one was on its way: send the newer choice too.
    if (readStored() !== started) void syncPending(queryClient);
  });
  return syncing;
}

/**
 * The units the signed-in person works in (their own choice, else the company's default, from the
 * server; the last known units while offline), and a setter for their own choice: `null` for a unit
 * goes back to following the company. Everything is stored in SI whatever is shown.
 */
export function useUnitPreferences(): [UnitPreferences, (next: { length: LengthUnits | null; gauge: GaugeUnits | null }) => void] {
  const queryClient = useQueryClient();
  const user = useSessionUser();
  const stored = useSyncExternalStore(subscribe, readStored, readStored);
  const server = useQuery({ ...getMyPreferencesQueryOptions(), enabled: user !== undefined });
  const isPending = stored !== undefined && !stored.synced;

  // Keep the local copy in step with the server, and send a pending choice once it can be.
  useEffect(() => {
    if (!user) return;
    if (isPending) {
      void syncPending(queryClient);
      const retry = () => void syncPending(queryClient);
      window.addEventListener('online', retry);
      return () => window.removeEventListener('online', retry);
    }
    const effective = server.data?.effective;
    if (effective && (stored?.length !== effective.length || stored.gauge !== effective.gauge)) {
      writeStored({ ...effective, synced: true });
    }
    return undefined;
  }, [isPending, queryClient, server.data, stored, user]);

  const value: UnitPreferences = isPending
    ? { length: stored.length, gauge: stored.gauge }
    : (server.data?.effective ?? (stored ? { length: stored.length, gauge: stored.gauge } : defaultUnitPreferences()));

  const set = useCallback(
    (next: { length: LengthUnits | null; gauge: GaugeUnits | null }) => {
      const company = queryClient.getQueryData<MyPreferencesResponse>(getMyPreferencesQueryOptions().queryKey)?.company;
      const fallback = company ? { length: company.lengthUnits, gauge: company.gaugeUnits } : (readStored() ?? defaultUnitPreferences());
      const own: OwnChoice = { lengthUnits: next.length, gaugeUnits: next.gauge };
      // Shown at once, on this device, even offline; the server gets it as soon as it can.
      writeStored({ length: next.length ?? fallback.length, gauge: next.gauge ?? fallback.gauge, own, userId: getSessionUser()?.id });
      if (getSessionUser()) void syncPending(queryClient);
    },
    [queryClient],
  );

  return [value, set];
}

/** The person's own choices (`null` = following the company) and the company's defaults, from the server. */
export function useMyUnitChoice(): { own: OwnChoice | undefined; company: UnitPreferences | undefined } {
  const user = useSessionUser();
  const stored = useSyncExternalStore(subscribe, readStored, readStored);
  const server = useQuery({ ...getMyPreferencesQueryOptions(), enabled: user !== undefined });
  const own = stored && !stored.synced ? (stored.own ?? { lengthUnits: stored.length, gaugeUnits: stored.gauge }) : server.data
    ? { lengthUnits: server.data.lengthUnits, gaugeUnits: server.data.gaugeUnits }
    : undefined;
  const company = server.data ? { length: server.data.company.lengthUnits, gauge: server.data.company.gaugeUnits } : undefined;
  return { own, company };
}
