import type { AsBuilt } from '../as-built/as-built.schema.js';
import { type DateStyle, formatDate } from '../format/date-time.js';
import type { ChannelSetup } from '../jobs/job-record.schema.js';
import type { SiteRecordInfo } from '../jobs/job.schema.js';

/*
 * Issue 21: a packet is a revision of the site's record. When it follows an earlier packet of the same
 * property (a later revision of the job, or a later job), it says which packet it supersedes and what
 * changed against that packet's frozen system: records added, changed, abandoned in place and removed,
 * each with its date. Frozen into the snapshot at issue, so the printed page never changes.
 */

/** The earlier packet of the site this one replaces as the current record. */
export interface SupersededPacket {
  revisionId: string;
  jobId: string;
  jobTitle: string;
  revision: number;
  /** ISO timestamp of that packet's issue. */
  issuedAt: string;
}

export interface ChangedRecord {
  kind: 'item' | 'run';
  id: string;
  label: string;
  /** ISO date the change happened (the work date of the job that made it). */
  on: string;
  /** The job that made the change. */
  jobTitle: string;
}

export interface WhatChanged {
  supersedes: SupersededPacket;
  added: ChangedRecord[];
  changed: ChangedRecord[];
  abandoned: ChangedRecord[];
  removed: ChangedRecord[];
}

/** Amplifier channel set-ups by channel id, as a packet snapshot keeps them (`channelSetups`). */
export type ChannelSetups = Readonly<Record<string, ChannelSetup>>;

type SystemRecord = { kind: 'item' | 'run'; id: string; label: string; isAbandoned: boolean; json: string; channelIds: string[] };

/** JSON with object keys sorted, so a record read back from jsonb (which reorders keys) compares equal. */
function canonical(value: unknown): string {
  return JSON.stringify(value, (_key, v: unknown) =>
    v !== null && typeof v === 'object' && !Array.isArray(v)
      ? Object.fromEntries(Object.entries(v as Record<string, unknown>).sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0)))
      : v,
  );
}

function recordsOf(asBuilt: AsBuilt): Map<string, SystemRecord> {
  const out = new Map<string, SystemRecord>();
  for (const item of asBuilt.items) {
    const channelIds = item.kind === 'amplifier' ? item.channels.map((c) => c.id) : [];
    out.set(item.id, { kind: 'item', id: item.id, label: item.label, isAbandoned: false, json: canonical(item), channelIds });
  }
  for (const run of asBuilt.runs) {
    out.set(run.id, { kind: 'run', id: run.id, label: run.label, isAbandoned: run.isAbandoned === true, json: canonical(run), channelIds: [] });
  }
  return out;
}

/** A packet of the site as a baseline for What changed: its frozen as-built, and whether it froze the whole site. */
export interface BaselinePacket {
  issuedAt: string;
  asBuilt: AsBuilt;
  /** Issued since the site record (issue 21): its as-built is the site's whole system, not one job's records. */
  isSiteWide: boolean;
  /** Its amplifier channel set-ups (absent where the caller has none). */
  channelSetups?: ChannelSetups | null;
}

/**
 * The site's system as the superseded packet left it. A packet issued since the site record froze the
 * whole system, so it is the baseline alone. A packet issued before froze only its own job's records:
 * the system then was every job's newest packet up to that one, merged (the later packet's copy of a
 * record wins), or every other job's records would read as added by the next packet. `packets` are the
 * superseded packet and each other job's newest packet up to it; an empty list has no baseline.
 */
export function baselineSystem(packets: readonly BaselinePacket[]): AsBuilt | undefined {
  const ordered = [...packets].sort((a, b) => (a.issuedAt < b.issuedAt ? -1 : a.issuedAt > b.issuedAt ? 1 : 0));
  const latest = ordered.at(-1);
  if (!latest || latest.isSiteWide) return latest?.asBuilt;
  const items = new Map<string, AsBuilt['items'][number]>();
  const runs = new Map<string, AsBuilt['runs'][number]>();
  for (const packet of ordered) {
    for (const item of packet.asBuilt.items) items.set(item.id, item);
    for (const run of packet.asBuilt.runs) runs.set(run.id, run);
  }
  return { ...latest.asBuilt, items: [...items.values()], runs: [...runs.values()] };
}

/**
 * The amplifier channel set-ups the superseded packet left, merged from the same packets as
 * baselineSystem (a later packet's set-up of a channel wins); undefined when there is none.
 */
export function baselineChannelSetups(packets: readonly BaselinePacket[]): ChannelSetups | undefined {
  const ordered = [...packets].sort((a, b) => (a.issuedAt < b.issuedAt ? -1 : a.issuedAt > b.issuedAt ? 1 : 0));
  const latest = ordered.at(-1);
  if (!latest) return undefined;
  if (latest.isSiteWide) return latest.channelSetups ?? undefined;
  return Object.assign({}, ...ordered.map((p) => p.channelSetups ?? {})) as ChannelSetups;
}

/**
 * What changed from the superseded packet's system to this one. `records` is the provenance of the
 * current system (who installed, changed, abandoned each record, and when); `removed` lists the records
 * this job took out (absent from the current system), with their dates; `job` is the issuing job.
 * `setups` are the channel set-ups of both systems: an amplifier whose channel was set up differently
 * (a gain turned down) is changed, though its as-built fields are not; a channel either side lacks a
 * set-up for is not compared.
 */
export function whatChanged(input: {
  supersedes: SupersededPacket;
  previous: AsBuilt;
  current: AsBuilt;
  records: Readonly<Record<string, SiteRecordInfo>>;
  removed: readonly { kind: 'item' | 'run'; id: string; label: string; removedOn: string }[];
  job: { id: string; title: string; workDate: string };
  setups?: { previous: ChannelSetups; current: ChannelSetups };
}): WhatChanged {
  const before = recordsOf(input.previous);
  const after = recordsOf(input.current);
  const result: WhatChanged = { supersedes: input.supersedes, added: [], changed: [], abandoned: [], removed: [] };
  for (const record of after.values()) {
    const info = input.records[record.id];
    const old = before.get(record.id);
    const entry = (on: string, jobTitle: string): ChangedRecord => ({ kind: record.kind, id: record.id, label: record.label, on, jobTitle });
    if (!old) {
      result.added.push(entry(info?.installedOn ?? input.job.workDate, info?.installedBy.jobTitle ?? input.job.title));
    } else if (record.isAbandoned && !old.isAbandoned) {
      result.abandoned.push(entry(info?.abandoned?.on ?? input.job.workDate, info?.abandoned?.jobTitle ?? input.job.title));
    } else if (record.json !== old.json || isSetUpDifferently(record.channelIds, input.setups)) {
      const last = info?.changedBy.at(-1);
      result.changed.push(entry(last?.on ?? input.job.workDate, last?.jobTitle ?? input.job.title));
    }
  }
  const removedById = new Map(input.removed.map((r) => [r.id, r]));
  for (const record of before.values()) {
    if (after.has(record.id)) continue;
    const removal = removedById.get(record.id);
    result.removed.push({ kind: record.kind, id: record.id, label: record.label, on: removal?.removedOn ?? input.job.workDate, jobTitle: input.job.title });
  }
  return result;
}

function isSetUpDifferently(channelIds: readonly string[], setups: { previous: ChannelSetups; current: ChannelSetups } | undefined): boolean {
  if (!setups) return false;
  return channelIds.some((id) => {
    const [before, after] = [setups.previous[id], setups.current[id]];
    return before !== undefined && after !== undefined && canonical(before) !== canonical(after);
  });
}

/** The packet's "What changed" section, every date written out. */
export interface WhatChangedView {
  supersedes: string;
  groups: { title: string; rows: { label: string; kind: string; on: string; job: string }[] }[];
}

const KIND_WORDS: Record<'item' | 'run', string> = { item: 'Equipment', run: 'Cable run' };

/**
 * The "What changed" section of a packet from its frozen snapshot, or null for a site's first packet
 * (and for revisions issued before the site record existed). Dates in the company's zone and locale.
 */
export function whatChangedView(snapshot: {
  whatChanged?: WhatChanged;
  settings: { timeZone?: string | null; locale?: string };
}): WhatChangedView | null {
  const changes = snapshot.whatChanged;
  if (!changes) return null;
  const style: DateStyle = { timeZone: snapshot.settings.timeZone ?? null, locale: snapshot.settings.locale ?? null };
  const rows = (list: readonly ChangedRecord[]) =>
    list.map((r) => ({ label: r.label, kind: KIND_WORDS[r.kind], on: formatDate(r.on, style), job: r.jobTitle }));
  const { supersedes } = changes;
  return {
    supersedes: `This packet supersedes revision ${supersedes.revision} of "${supersedes.jobTitle}", issued ${formatDate(supersedes.issuedAt, style)}. It describes the whole system at this property as it stands now; the earlier packet shows it as it stood then.`,
    groups: [
      { title: 'Added', rows: rows(changes.added) },
      { title: 'Changed', rows: rows(changes.changed) },
      { title: 'Abandoned in place (still in the ground)', rows: rows(changes.abandoned) },
      { title: 'Removed', rows: rows(changes.removed) },
    ].filter((g) => g.rows.length > 0),
  };
}
