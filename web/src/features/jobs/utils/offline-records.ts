import type { JobAsBuiltResponse } from '../../job-record';
import type { JobWrite, JobWriteResponse } from '../api/send-job-write';

/*
 * Records created with no signal (issue 17): the record is shown at once in the kept as-built under an
 * id made on this device, so later offline work can build on it (a run to a speaker added offline, a
 * check of its channel); once the server has created it, the waiting writes are rewritten to the id
 * the server gave it. Amplifier channels made offline go by `<local id>:ch<index>`.
 */

type Creating = 'createItem' | 'createRun' | 'createZone' | 'createCheck' | 'createReferencePoint';

const LISTS: Record<Creating, 'items' | 'runs' | 'zones' | 'checks' | 'referencePoints'> = {
  createItem: 'items',
  createRun: 'runs',
  createZone: 'zones',
  createCheck: 'checks',
  // A reference point of the site made from the job: ties made offline pick it under its local id.
  createReferencePoint: 'referencePoints',
};

function creates(write: JobWrite): write is JobWrite & { endpoint: Creating } {
  return write.endpoint in LISTS;
}

/** A new id for a record made on this device (a UUID, as the API's ids are, so forms accept it). */
export function newLocalId(): string {
  if (typeof crypto !== 'undefined' && typeof crypto.randomUUID === 'function') return crypto.randomUUID();
  return `00000000-0000-4000-8000-${Date.now().toString(16).padStart(12, '0').slice(-12)}`;
}

export function localChannelId(localId: string, index: number): string {
  return `${localId}:ch${index}`;
}

/** Gives a queued create its local id (other writes are returned as they are). */
export function withLocalId(write: JobWrite): JobWrite {
  return creates(write) && !write.localId ? { ...write, localId: newLocalId() } : write;
}

/** The kept as-built with the record a queued create makes, under its local id. */
export function withOfflineRecord(previous: JobAsBuiltResponse | undefined, write: JobWrite): JobAsBuiltResponse | undefined {
  if (!previous || !creates(write) || !write.localId || typeof write.body !== 'object' || write.body === null) return previous;
  const body = write.body as Record<string, unknown>;
  const record: Record<string, unknown> = { ...body, id: write.localId };
  if (Array.isArray(body.channels)) {
    record.channels = (body.channels as Record<string, unknown>[]).map((channel, index) => ({ ...channel, id: channel.id ?? localChannelId(write.localId!, index) }));
  }
  const list = LISTS[write.endpoint];
  const asBuilt = previous.asBuilt as unknown as Record<string, unknown[]>;
  return { ...previous, asBuilt: { ...previous.asBuilt, [list]: [...(asBuilt[list] ?? []), record] } };
}

/** Local id → server id, learned from the answer to a queued create (with an amplifier's channels by position). */
export function idsLearned(write: JobWrite, response: JobWriteResponse): Map<string, string> {
  const ids = new Map<string, string>();
  if (!creates(write) || !write.localId) return ids;
  // A record write answers `{ item: … }`; a reference point write answers the point itself.
  const created = (write.endpoint === 'createReferencePoint' ? response : response[LISTS[write.endpoint].slice(0, -1)]) as
    | { id?: unknown; channels?: { id?: unknown }[] }
    | undefined;
  if (typeof created?.id !== 'string') return ids;
  ids.set(write.localId, created.id);
  created.channels?.forEach((channel, index) => {
    if (typeof channel.id === 'string') ids.set(localChannelId(write.localId!, index), channel.id);
  });
  return ids;
}

function swap(value: unknown, ids: ReadonlyMap<string, string>): unknown {
  if (typeof value === 'string') return ids.get(value) ?? value;
  if (Array.isArray(value)) return value.map((entry) => swap(entry, ids));
  if (typeof value === 'object' && value !== null) return Object.fromEntries(Object.entries(value).map(([key, entry]) => [key, swap(entry, ids)]));
  return value;
}

/** `write` with every local id in its parameters and body replaced by the server's (the same object when none). */
export function withServerIds(write: JobWrite, ids: ReadonlyMap<string, string>): JobWrite {
  if (ids.size === 0) return write;
  const params = swap(write.params, ids);
  const body = swap(write.body, ids);
  if (JSON.stringify(params) === JSON.stringify(write.params) && JSON.stringify(body) === JSON.stringify(write.body)) return write;
  return { ...write, params, body } as JobWrite;
}
