import { describe, expect, it } from 'vitest';

import type { AsBuilt } from '../as-built/as-built.schema.js';
import type { SiteRecordInfo } from '../jobs/job.schema.js';
import type { Finding } from './finding.js';
import { findingScope, findingScopeText } from './finding-scope.js';

// Only what the scope reads: ids, labels, a run's ends and the channel its pair carries.
const channel = { amplifierItemId: 'amp', channelId: 'ch-1' };
const asBuilt = {
  items: [
    { id: 'amp', label: 'Pool house amplifier' },
    { id: 'lawn', label: 'Lawn speaker' },
    { id: 'fire', label: 'Fire pit speaker' },
    { id: 'spare-end', label: 'Spare end by the planter' },
  ],
  runs: [
    { id: 'r-lawn', label: 'Amp to lawn speaker', fromItemId: 'amp', toItemId: 'lawn', pairs: [{ pairIndex: 1, channel }] },
    { id: 'r-fire', label: 'Planter to fire pit', fromItemId: 'spare-end', toItemId: 'fire', pairs: [{ pairIndex: 1, channel }] },
    { id: 'r-other', label: 'Unrelated', fromItemId: 'amp', toItemId: 'spare-end', pairs: [{ pairIndex: 1, channel: null }] },
  ],
} as unknown as AsBuilt;

const earlier = (kind: 'item' | 'run'): SiteRecordInfo => ({
  kind,
  isThisJob: false,
  installedBy: { jobId: 'job-a', jobTitle: 'Garden speakers' },
  installedOn: '2026-05-14',
  changedBy: [],
  abandoned: null,
});
const mine = (kind: 'item' | 'run'): SiteRecordInfo => ({ ...earlier(kind), isThisJob: true, installedBy: { jobId: 'job-b', jobTitle: 'Fire pit zone' }, installedOn: '2027-04-02' });
const siteRecords: Record<string, SiteRecordInfo> = {
  amp: earlier('item'),
  lawn: earlier('item'),
  'spare-end': earlier('item'),
  'r-lawn': earlier('run'),
  'r-other': earlier('run'),
  fire: mine('item'),
  'r-fire': mine('run'),
};
const finding = (over: Partial<Finding>): Finding => ({ code: 'DEPTH_SHALLOW', severity: 'warning', message: 'm', path: [], ...over });

describe(findingScope.name, () => {
  it('says a finding on this job’s run is about this job’s work', () => {
    const sut = findingScope(finding({ runId: 'r-fire', path: ['runs', 1, 'depthReadings', 0] }), asBuilt, siteRecords)!;
    expect(sut).toEqual({ hasThisJob: true, earlier: [] });
    expect(findingScopeText(sut)).toBe('About this job’s work.');
  });

  it('names the earlier job and its date for a finding on a record already in the ground (also found by path alone)', () => {
    const sut = findingScope(finding({ path: ['runs', 0, 'depthReadings', 0] }), asBuilt, siteRecords)!;
    expect(sut).toEqual({ hasThisJob: false, earlier: [{ jobId: 'job-a', jobTitle: 'Garden speakers', installedOn: '2026-05-14', labels: ['Amp to lawn speaker'] }] });
    expect(findingScopeText(sut, { locale: 'en-US' })).toBe(
      'About records already in the ground: “Amp to lawn speaker” (installed May 14, 2026 by “Garden speakers”).',
    );
  });

  it('takes a channel finding to the amplifier, every run on the channel and their ends: both jobs', () => {
    const sut = findingScope(finding({ code: 'LOAD_BELOW_AMP_MINIMUM', severity: 'critical', channel, path: ['items', 0, 'channels', 0] }), asBuilt, siteRecords)!;
    expect(sut.hasThisJob).toBe(true);
    expect(sut.earlier).toHaveLength(1);
    // The spare run on no channel is not part of it.
    expect(sut.earlier[0]!.labels).toEqual(['Pool house amplifier', 'Amp to lawn speaker', 'Lawn speaker', 'Spare end by the planter']);
    expect(findingScopeText(sut)).toMatch(/^About this job’s work and records already in the ground: “Pool house amplifier”, /);
  });

  it('has no scope without site records or for a finding about no record', () => {
    expect(findingScope(finding({ runId: 'r-fire' }), asBuilt, undefined)).toBeNull();
    expect(findingScope(finding({ path: ['site'] }), asBuilt, siteRecords)).toBeNull();
  });
});
