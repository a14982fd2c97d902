import { describe, expect, it } from 'vitest';

import type { AsBuilt } from '../as-built/as-built.schema.js';
import { DEMO_AS_BUILT } from '../as-built/demo-as-built.js';
import { baselineChannelSetups, baselineSystem, type ChannelSetups, whatChanged, whatChangedView } from './what-changed.js';

const supersedes = { revisionId: 'rev-1', jobId: 'job-a', jobTitle: 'Garden speakers', revision: 1, issuedAt: '2026-05-14T16:00:00.000Z' };
const job = { id: 'job-b', title: 'Fire pit zone', workDate: '2027-04-02' };

describe(whatChanged.name, () => {
  const [first, second, third, ...rest] = DEMO_AS_BUILT.runs;
  // Against the first packet: the first run abandoned in place, the second changed (its spare flag),
  // the third taken out, a new run added; everything else as it was.
  const current: AsBuilt = {
    ...DEMO_AS_BUILT,
    runs: [
      { ...first!, isAbandoned: true },
      { ...second!, isSpare: !(second!.isSpare ?? false) },
      ...rest,
      { ...second!, id: 'run-new', label: 'Planter to fire pit' },
    ],
  };

  it('lists what was added, changed, abandoned and removed against the superseded packet, with dates and jobs', () => {
    const sut = whatChanged({
      supersedes,
      previous: DEMO_AS_BUILT,
      current,
      records: {
        'run-new': { kind: 'run', isThisJob: true, installedBy: { jobId: 'job-b', jobTitle: 'Fire pit zone' }, installedOn: '2027-04-02', changedBy: [], abandoned: null },
      },
      removed: [{ kind: 'run', id: third!.id, label: third!.label, removedOn: '2027-04-03' }],
      job,
    });
    expect(sut.supersedes).toBe(supersedes);
    expect(sut.added).toEqual([{ kind: 'run', id: 'run-new', label: 'Planter to fire pit', on: '2027-04-02', jobTitle: 'Fire pit zone' }]);
    expect(sut.abandoned.map((r) => r.id)).toEqual([first!.id]);
    expect(sut.changed.map((r) => r.id)).toEqual([second!.id]);
    expect(sut.removed).toEqual([{ kind: 'run', id: third!.id, label: third!.label, on: '2027-04-03', jobTitle: 'Fire pit zone' }]);
    // Items the later system still has unchanged are not listed.
    expect([...sut.added, ...sut.changed, ...sut.abandoned, ...sut.removed].some((r) => r.kind === 'item')).toBe(false);
  });

  it('prints the superseded packet and only the groups that have rows, dates written out', () => {
    const changes = whatChanged({ supersedes, previous: DEMO_AS_BUILT, current: DEMO_AS_BUILT, records: {}, removed: [], job });
    const view = whatChangedView({ whatChanged: changes, settings: { timeZone: 'UTC', locale: 'en-US' } });
    expect(view!.supersedes).toContain('supersedes revision 1 of "Garden speakers", issued May 14, 2026');
    expect(view!.groups).toEqual([]);
    // A record read back from the database's jsonb has its keys in another order: still unchanged.
    const reordered = JSON.parse(JSON.stringify(DEMO_AS_BUILT), (_k, v: unknown) =>
      v !== null && typeof v === 'object' && !Array.isArray(v) ? Object.fromEntries(Object.entries(v).reverse()) : v,
    ) as AsBuilt;
    const same = whatChanged({ supersedes, previous: reordered, current: DEMO_AS_BUILT, records: {}, removed: [], job });
    expect([...same.added, ...same.changed, ...same.abandoned, ...same.removed]).toEqual([]);
    expect(whatChangedView({ settings: {} })).toBeNull();
  });
});

describe('an amplifier setting as a change (issue 21)', () => {
  const amp = DEMO_AS_BUILT.items.find((i) => i.kind === 'amplifier')!;
  const [patio, spa] = amp.kind === 'amplifier' ? amp.channels : [];
  const setup = (gain: string | null) => ({ source: null, gain, volumeLimit: null, eq: null, crossover: null, polarity: null, firmware: null, networkName: null, notes: null });
  const previous: ChannelSetups = { [patio!.id]: setup('-12 dB'), [spa!.id]: setup(null) };
  const compare = (current: ChannelSetups) =>
    whatChanged({ supersedes, previous: DEMO_AS_BUILT, current: DEMO_AS_BUILT, records: {}, removed: [], job, setups: { previous, current } });

  it('lists the amplifier as changed when a channel is set up differently, its fields unchanged', () => {
    expect(compare({ ...previous, [patio!.id]: setup('-6 dB') }).changed).toEqual([{ kind: 'item', id: amp.id, label: amp.label, on: '2027-04-02', jobTitle: 'Fire pit zone' }]);
  });

  it('lists nothing when the set-ups are the same, or a channel has no set-up on one side', () => {
    expect(compare({ ...previous }).changed).toEqual([]);
    expect(compare({ [spa!.id]: setup(null) }).changed).toEqual([]);
  });

  it('takes the baseline set-ups from the site-wide packet alone, else merged with the later packet winning', () => {
    const older = { issuedAt: '2026-05-14T16:00:00.000Z', asBuilt: DEMO_AS_BUILT, isSiteWide: false, channelSetups: previous };
    const newer = { issuedAt: '2026-09-01T10:00:00.000Z', asBuilt: DEMO_AS_BUILT, isSiteWide: false, channelSetups: { [patio!.id]: setup('-3 dB') } };
    expect(baselineChannelSetups([newer, older])).toEqual({ [patio!.id]: setup('-3 dB'), [spa!.id]: setup(null) });
    expect(baselineChannelSetups([older, { ...newer, isSiteWide: true }])).toEqual({ [patio!.id]: setup('-3 dB') });
    expect(baselineChannelSetups([{ ...older, channelSetups: null, isSiteWide: true }])).toBeUndefined();
    expect(baselineChannelSetups([])).toBeUndefined();
  });
});

describe(baselineSystem.name, () => {
  // Two jobs on one property, each packet issued before the site record froze only its own job's records.
  const [ampItem, ...otherItems] = DEMO_AS_BUILT.items;
  const [firstRun, ...otherRuns] = DEMO_AS_BUILT.runs;
  const jobA: AsBuilt = { ...DEMO_AS_BUILT, items: [ampItem!], runs: [firstRun!] };
  const jobB: AsBuilt = { ...DEMO_AS_BUILT, items: otherItems, runs: otherRuns };
  const older = { issuedAt: '2026-05-14T16:00:00.000Z', asBuilt: jobA, isSiteWide: false };
  const newer = { issuedAt: '2026-09-01T10:00:00.000Z', asBuilt: jobB, isSiteWide: false };

  it('merges every job’s packet of then when the superseded packet froze only its own job', () => {
    const sut = baselineSystem([newer, older])!;
    expect(sut.items.map((i) => i.id).sort()).toEqual(DEMO_AS_BUILT.items.map((i) => i.id).sort());
    expect(sut.runs.map((r) => r.id).sort()).toEqual(DEMO_AS_BUILT.runs.map((r) => r.id).sort());
    // The next packet (the whole system) then lists nothing of the other job as added.
    const changes = whatChanged({ supersedes, previous: sut, current: DEMO_AS_BUILT, records: {}, removed: [], job });
    expect([...changes.added, ...changes.changed, ...changes.abandoned, ...changes.removed]).toEqual([]);
    // Against the superseded packet alone, the first job's records would all read as added.
    const naive = whatChanged({ supersedes, previous: jobB, current: DEMO_AS_BUILT, records: {}, removed: [], job });
    expect(naive.added.map((r) => r.id).sort()).toEqual([ampItem!.id, firstRun!.id].sort());
  });

  it('takes a site-wide packet alone, a later copy of a record wins, and no packet has no baseline', () => {
    const siteWide = { issuedAt: '2027-04-02T10:00:00.000Z', asBuilt: jobB, isSiteWide: true };
    expect(baselineSystem([older, siteWide])).toBe(jobB);
    const relabelled = { ...older, issuedAt: '2026-10-01T10:00:00.000Z', asBuilt: { ...jobA, runs: [{ ...firstRun!, label: 'Relabelled' }] } };
    expect(baselineSystem([older, relabelled, newer])!.runs.find((r) => r.id === firstRun!.id)!.label).toBe('Relabelled');
    expect(baselineSystem([])).toBeUndefined();
  });
});
