import { describe, expect, it } from 'vitest';

import { AsBuiltSchema } from '../domain/as-built/as-built.schema.js';
import { DEMO_AS_BUILT } from '../domain/as-built/demo-as-built.js';
import type {
  AmplifierChannelRow,
  CommissioningCheckRow,
  DepthReadingRow,
  ItemRow,
  ItemTieRow,
  ReferencePointRow,
  RunPairRow,
  RunRoutePointRow,
  RunRow,
  ZoneRow,
} from '../db/schema/index.js';
import { depthReadingIdsByRun, type JobRecordRows, toAsBuilt, toChannelSetups, toRecordRows, toSiteRecords } from './as-built-rows.js';

const now = new Date('2026-05-14T12:00:00Z');

/** What the database would return for rows inserted in order: sequences, defaults and generated ids. */
function asStored(asBuilt = DEMO_AS_BUILT): JobRecordRows {
  let readingId = 0;
  const rows = toRecordRows(asBuilt, {
    jobId: 'job-1',
    siteId: 'site-1',
    installedOn: '2026-05-14',
    idFor: (id) => `db:${id}`,
    newId: () => `db:reading-${(readingId += 1)}`,
  });
  const seq = <T>(list: T[]) => list.map((row, i) => ({ ...row, seq: i + 1 }));
  return {
    site: { northAzimuthDeg: asBuilt.site?.northAzimuthDeg ?? 0, originLat: asBuilt.site?.origin?.lat ?? null, originLon: asBuilt.site?.origin?.lon ?? null },
    zones: seq(rows.zones) as ZoneRow[],
    referencePoints: seq(rows.referencePoints).map((p) => ({ ...p, notes: null, createdAt: now })) as ReferencePointRow[],
    items: seq(rows.items).map((i) => ({ ...i, abandonedByJobId: null, abandonedOn: null, removedByJobId: null, removedOn: null, createdAt: now, updatedAt: now })) as ItemRow[],
    channels: seq(rows.channels).map((c) => ({
      ...c,
      source: null,
      gain: null,
      volumeLimit: null,
      eq: null,
      crossover: null,
      polarity: null,
      firmware: null,
      networkName: null,
      setupNotes: null,
    })) as AmplifierChannelRow[],
    ties: rows.ties.map((t, i) => ({ ...t, id: `tie-${i}` })) as ItemTieRow[],
    runs: seq(rows.runs).map((r) => ({ ...r, abandonedByJobId: null, abandonedOn: null, removedByJobId: null, removedOn: null, createdAt: now, updatedAt: now })) as RunRow[],
    pairs: rows.pairs.map((p, i) => ({ ...p, id: `pair-${i}` })) as RunPairRow[],
    routePoints: rows.routePoints.map((p, i) => ({ ...p, id: `point-${i}` })) as RunRoutePointRow[],
    depthReadings: seq(rows.depthReadings).map((r) => ({ ...r, recordedByUserId: null, recordedAt: now })) as DepthReadingRow[],
    checks: seq(rows.checks).map((c) => ({ ...c, recordedAt: now })) as CommissioningCheckRow[],
  };
}

function withDbIds<T>(value: T): T {
  const ids = new Set<string>();
  const collect = (v: unknown, key?: string) => {
    if (typeof v === 'string' && key && /^(id|.*Id)$/.test(key)) ids.add(v);
    else if (Array.isArray(v)) v.forEach((x) => collect(x));
    else if (v && typeof v === 'object') Object.entries(v).forEach(([k, x]) => collect(x, k));
  };
  collect(value);
  return JSON.parse(JSON.stringify(value), (_k, v: unknown) => (typeof v === 'string' && ids.has(v) ? `db:${v}` : v)) as T;
}

describe('toAsBuilt', () => {
  it('should rebuild the demo as-built from its rows, with database ids', () => {
    const { units: _units, ...expected } = withDbIds(DEMO_AS_BUILT);
    const asBuilt = toAsBuilt(asStored());
    expect(asBuilt).toEqual(expected);
    expect(AsBuiltSchema.parse(asBuilt)).toEqual(asBuilt);
  });

  it('should order arrays by sequence, ties and route points by ordinal, readings by station', () => {
    const rows = asStored();
    const shuffled: JobRecordRows = {
      ...rows,
      items: [...rows.items].reverse(),
      ties: [...rows.ties].reverse(),
      routePoints: [...rows.routePoints].reverse(),
      depthReadings: [...rows.depthReadings].reverse(),
      pairs: [...rows.pairs].reverse(),
    };
    expect(toAsBuilt(shuffled)).toEqual(toAsBuilt(rows));
  });

  it('should keep a GPS bend with its accuracy and read a bend without a source back without one (issue 17)', () => {
    const asBuilt = structuredClone(DEMO_AS_BUILT) as { -readonly [K in keyof typeof DEMO_AS_BUILT]: (typeof DEMO_AS_BUILT)[K] };
    const run = asBuilt.runs.find((r) => (r.route?.length ?? 0) >= 2)!;
    run.route![1] = { ...run.route![1]!, source: 'gps', accuracyM: 4.2 };
    const rows = asStored(asBuilt);
    const stored = rows.routePoints.filter((p) => p.runId === `db:${run.id}`);
    expect(stored[1]).toMatchObject({ source: 'gps', accuracyM: 4.2 });
    expect(stored[0]).toMatchObject({ source: null, accuracyM: null });
    const back = toAsBuilt(rows).runs.find((r) => r.id === `db:${run.id}`)!;
    expect(back.route![1]).toEqual({ x: run.route![1]!.x, y: run.route![1]!.y, source: 'gps', accuracyM: 4.2 });
    expect(back.route![0]).toEqual({ x: run.route![0]!.x, y: run.route![0]!.y });
  });

  it('should omit optional fields whose columns are null instead of returning null', () => {
    const rows = asStored();
    const bare = toAsBuilt({ ...rows, runs: rows.runs.map((r) => ({ ...r, location: null, notes: null })) });
    for (const run of bare.runs) {
      expect(run).not.toHaveProperty('location');
      expect(run).not.toHaveProperty('notes');
    }
    expect(bare.runs.filter((r) => r.isSpare)).toHaveLength(1);
    expect(bare.runs.every((r) => !('isAbandoned' in r))).toBe(true);
  });

  it('should leave out the GPS origin when the site has none', () => {
    const rows = asStored();
    expect(toAsBuilt({ ...rows, site: { northAzimuthDeg: 0, originLat: null, originLon: null } }).site).toEqual({ northAzimuthDeg: 0 });
  });
});

describe('another open job’s unissued change (issue 21)', () => {
  // The earlier job installed the demo; a later open job (not the one viewing) relabelled and abandoned
  // a run without issuing; a third job views the system. An issued change by the viewer's own job stays.
  const rows = asStored();
  const run = rows.runs[0]!;
  const asBefore = toAsBuilt(rows).runs[0]!;
  const change = (jobId: string, issuedAt: Date | null) => ({
    id: `change-${jobId}`,
    siteId: 'site-1',
    jobId,
    recordKind: 'run' as const,
    recordId: run.id,
    change: 'abandoned' as const,
    before: { record: asBefore, abandoned: null } as unknown as Record<string, unknown>,
    changedOn: '2027-04-02',
    issuedAt,
    createdAt: now,
    updatedAt: now,
  });
  const changedRows = (viewer: string, issuedAt: Date | null): JobRecordRows => ({
    ...rows,
    runs: rows.runs.map((r) => (r.id === run.id ? { ...r, label: 'Relabelled by the open job', isAbandoned: true, abandonedByJobId: 'job-open', abandonedOn: '2027-04-02' } : r)),
    system: { jobId: viewer, jobTitles: { 'job-1': 'Garden speakers', 'job-open': 'Fire pit zone', 'job-view': 'Hedge lights' }, changes: [change('job-open', issuedAt)], removedByThisJob: [] },
  });

  it('shows the record as it was before the change to any other job, with no trace of it in its provenance', () => {
    const viewed = changedRows('job-view', null);
    expect(toAsBuilt(viewed).runs[0]).toEqual(asBefore);
    expect(toSiteRecords(viewed)[run.id]).toMatchObject({ changedBy: [], abandoned: null });
  });

  it('shows the change to the job that made it, and to everyone once it is issued', () => {
    for (const viewed of [changedRows('job-open', null), changedRows('job-view', now)]) {
      expect(toAsBuilt(viewed).runs[0]).toMatchObject({ label: 'Relabelled by the open job', isAbandoned: true });
      expect(toSiteRecords(viewed)[run.id]).toMatchObject({
        changedBy: [{ jobId: 'job-open', change: 'abandoned' }],
        abandoned: { jobId: 'job-open', jobTitle: 'Fire pit zone', on: '2027-04-02' },
      });
    }
  });
});

describe('toSiteRecords: which records are already issued (issue 21)', () => {
  it('marks another job’s records issued, and this job’s own only when added before its last issue', () => {
    const rows = asStored();
    const [older, newer] = rows.items;
    const later = new Date(now.getTime() + 60_000);
    const viewed = (jobId: string, lastIssuedAt: Date | null): JobRecordRows => ({
      ...rows,
      items: rows.items.map((i) => (i.id === newer!.id ? { ...i, createdAt: later } : i)),
      system: { jobId, jobTitles: {}, changes: [], removedByThisJob: [], lastIssuedAt },
    });
    const reopened = toSiteRecords(viewed('job-1', now));
    expect(reopened[older!.id]).toMatchObject({ isThisJob: true, isIssued: true });
    expect(reopened[newer!.id]).toMatchObject({ isThisJob: true, isIssued: false });
    expect(toSiteRecords(viewed('job-1', null))[older!.id]).toMatchObject({ isIssued: false });
    expect(toSiteRecords(viewed('job-2', null))[newer!.id]).toMatchObject({ isThisJob: false, isIssued: true });
  });
});

describe('toChannelSetups: another open job’s unissued amplifier setting (issue 21)', () => {
  // The earlier job left the amplifier's first channel at -12 dB; a later open job turned it to -6 dB
  // and added a channel, without issuing. The set-up is not part of the as-built item, so the change
  // row keeps it beside the item as it was.
  const rows = asStored();
  const amp = toAsBuilt(rows).items.find((i) => i.kind === 'amplifier')!;
  const [first, ...others] = rows.channels.filter((c) => c.itemId === amp.id);
  const setup = (gain: string | null) => ({ source: null, gain, volumeLimit: null, eq: null, crossover: null, polarity: null, firmware: null, networkName: null, notes: null });
  const added = { ...first!, id: 'db:channel-added-by-open-job', seq: 999, name: 'Added', gain: '0 dB' };
  const changedRows = (viewer: string, issuedAt: Date | null, before: Record<string, unknown>): JobRecordRows => ({
    ...rows,
    channels: [...rows.channels.map((c) => (c.id === first!.id ? { ...c, gain: '-6 dB' } : c)), added],
    system: {
      jobId: viewer,
      jobTitles: {},
      changes: [
        { id: 'change-1', siteId: 'site-1', jobId: 'job-open', recordKind: 'item', recordId: amp.id, change: 'changed', before, changedOn: '2027-04-02', issuedAt, createdAt: now, updatedAt: now },
      ],
      removedByThisJob: [],
    },
  });
  const before = { record: amp, abandoned: null, channelSetups: { [first!.id]: setup('-12 dB'), ...Object.fromEntries(others.map((c) => [c.id, setup(null)])) } };

  it('shows any other job the set-up as it was before the change, without the channel it added', () => {
    const setups = toChannelSetups(changedRows('job-view', null, before));
    expect(setups[first!.id]).toEqual(setup('-12 dB'));
    expect(setups).not.toHaveProperty(added.id);
    expect(Object.keys(setups).sort()).toEqual(rows.channels.map((c) => c.id).sort());
  });

  it('shows the change to the job that made it, and to everyone once it is issued', () => {
    for (const viewed of [changedRows('job-open', null, before), changedRows('job-view', now, before)]) {
      const setups = toChannelSetups(viewed);
      expect(setups[first!.id]).toEqual(setup('-6 dB'));
      expect(setups[added.id]).toEqual(setup('0 dB'));
    }
  });

  it('keeps a channel the other job deleted, with its set-up then, for everyone else until it is issued', () => {
    const deleted = others[0]!;
    const withDeletion = (viewer: string, issuedAt: Date | null) => {
      const changed = changedRows(viewer, issuedAt, { ...before, channelSetups: { ...before.channelSetups, [deleted.id]: setup('-3 dB') } });
      return { ...changed, channels: changed.channels.filter((c) => c.id !== deleted.id) };
    };
    expect(toChannelSetups(withDeletion('job-view', null))[deleted.id]).toEqual(setup('-3 dB'));
    expect(toChannelSetups(withDeletion('job-open', null))).not.toHaveProperty(deleted.id);
    expect(toChannelSetups(withDeletion('job-view', now))).not.toHaveProperty(deleted.id);
  });

  it('falls back to the channel row for a change recorded before set-ups were kept with it', () => {
    const setups = toChannelSetups(changedRows('job-view', null, { record: amp, abandoned: null }));
    expect(setups[first!.id]).toEqual(setup('-6 dB'));
    expect(setups).not.toHaveProperty(added.id);
  });
});

describe('depthReadingIdsByRun', () => {
  it('should list reading ids in the order of the as-built readings', () => {
    const rows = asStored();
    const ids = depthReadingIdsByRun(rows);
    const asBuilt = toAsBuilt(rows);
    for (const run of asBuilt.runs) {
      const readings = ids[run.id] ?? [];
      expect(readings.map((id) => rows.depthReadings.find((r) => r.id === id)!.stationM)).toEqual((run.depthReadings ?? []).map((r) => r.stationM));
    }
  });
});
