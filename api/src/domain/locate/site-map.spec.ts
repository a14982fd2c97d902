import { getIssues } from '@placemarkio/check-geojson';
import { describe, expect, it } from 'vitest';

import { analyzeAsBuilt } from '../analysis/analyze.js';
import type { AsBuilt } from '../as-built/as-built.schema.js';
import { DEMO_AS_BUILT } from '../as-built/demo-as-built.js';
import { buildSiteMap, type SiteMapSource } from './site-map.js';

function source(asBuilt: AsBuilt, revision: { id: string; n: number; jobId: string; issuedAt: string }): SiteMapSource {
  return {
    revisionId: revision.id,
    revision: revision.n,
    jobId: revision.jobId,
    jobTitle: `Job ${revision.jobId.slice(0, 4)}`,
    issuedAt: revision.issuedAt,
    asBuilt,
    analysis: analyzeAsBuilt(asBuilt),
  };
}

const REV_A = { id: '00000000-0000-4000-8000-00000000000a', n: 1, jobId: '10000000-0000-4000-8000-000000000001', issuedAt: '2025-04-01T10:00:00.000Z' };
const REV_B = { id: '00000000-0000-4000-8000-00000000000b', n: 2, jobId: '20000000-0000-4000-8000-000000000002', issuedAt: '2026-05-01T10:00:00.000Z' };

describe(buildSiteMap.name, () => {
  it('should tag every run and item with the revision it came from, in plan and WGS 84 coordinates', () => {
    const sut = buildSiteMap([source(DEMO_AS_BUILT, REV_A)]);
    expect(sut.runs).toHaveLength(DEMO_AS_BUILT.runs.length);
    expect(sut.items).toHaveLength(DEMO_AS_BUILT.items.length);
    expect(sut.runs.every((r) => r.revisionId === REV_A.id && r.revision === 1)).toBe(true);
    expect(sut.frame.origin).toEqual({ lat: 40, lon: -105 });
    const feature = sut.geojson!.features.find((f) => f.id === DEMO_AS_BUILT.runs[0]!.id)!;
    expect(feature.geometry?.type).toBe('LineString');
    expect(feature.properties).toMatchObject({ featureKind: 'run', revisionId: REV_A.id });
    expect(feature.properties.planRoute).toEqual(sut.runs[0]!.route!.map((p) => [p.x, p.y]));
    // [CHK] the locate map's GeoJSON passes an independent RFC 7946 validator (docs/reference.md §6).
    expect(getIssues(JSON.stringify(sut.geojson))).toEqual([]);
  });

  it('should add a later job’s runs, let a later revision replace a feature it records again, and mark abandoned runs', () => {
    const [first, ...rest] = DEMO_AS_BUILT.runs;
    const later: AsBuilt = {
      ...DEMO_AS_BUILT,
      runs: [{ ...first!, isAbandoned: true }, { ...rest[0]!, id: 'run-new', label: 'New spare run', isSpare: true }],
    };
    const sut = buildSiteMap([source(later, REV_B), source(DEMO_AS_BUILT, REV_A)]);
    expect(sut.revisions.map((r) => r.revision)).toEqual([1, 2]);
    expect(sut.runs).toHaveLength(DEMO_AS_BUILT.runs.length + 1);
    expect(sut.runs.find((r) => r.id === first!.id)).toMatchObject({ isAbandoned: true, revisionId: REV_B.id });
    expect(sut.runs.find((r) => r.id === 'run-new')).toMatchObject({ isSpare: true, revision: 2 });
    expect(sut.runs.find((r) => r.id === rest[1]!.id)).toMatchObject({ revisionId: REV_A.id });
  });

  it('should say per run which job installed it and when, since when it is abandoned, and drop removed runs (issue 21)', () => {
    const [first, second, third] = DEMO_AS_BUILT.runs;
    const info = (jobId: string, jobTitle: string, on: string, abandoned: { jobId: string; jobTitle: string; on: string } | null = null) => ({
      kind: 'run' as const,
      isThisJob: false,
      installedBy: { jobId, jobTitle },
      installedOn: on,
      changedBy: [],
      abandoned,
    });
    // The later job's snapshot is the whole site system: the first job's runs with their own provenance,
    // its own new run, the first run abandoned by it, and the third run taken out (not in its system).
    const later: AsBuilt = {
      ...DEMO_AS_BUILT,
      runs: [{ ...first!, isAbandoned: true }, second!, { ...second!, id: 'run-new', label: 'Planter to fire pit' }],
    };
    const sut = buildSiteMap([
      {
        ...source(later, REV_B),
        workDate: '2027-04-02',
        siteRecords: {
          [first!.id]: info(REV_A.jobId, 'Garden speakers', '2026-05-14', { jobId: REV_B.jobId, jobTitle: 'Fire pit zone', on: '2027-04-02' }),
          [second!.id]: info(REV_A.jobId, 'Garden speakers', '2026-05-14'),
          'run-new': { ...info(REV_B.jobId, 'Fire pit zone', '2027-04-02'), isThisJob: true },
        },
        removedIds: [third!.id],
      },
      { ...source(DEMO_AS_BUILT, REV_A), workDate: '2026-05-14' },
    ]);
    expect(sut.runs.find((r) => r.id === second!.id)).toMatchObject({ installedByJobTitle: 'Garden speakers', installedOn: '2026-05-14', abandonedOn: null });
    expect(sut.runs.find((r) => r.id === first!.id)).toMatchObject({ installedByJobTitle: 'Garden speakers', isAbandoned: true, abandonedOn: '2027-04-02' });
    expect(sut.runs.find((r) => r.id === 'run-new')).toMatchObject({ label: 'Planter to fire pit', installedByJobId: REV_B.jobId, installedOn: '2027-04-02' });
    expect(sut.runs.some((r) => r.id === third!.id)).toBe(false);
    expect(sut.geojson!.features.some((f) => f.id === third!.id)).toBe(false);
    // A revision issued before provenance was kept: its own job, on that job's work date.
    const old = buildSiteMap([{ ...source(DEMO_AS_BUILT, REV_A), workDate: '2026-05-14' }]);
    expect(old.runs[0]).toMatchObject({ installedByJobId: REV_A.jobId, installedOn: '2026-05-14', abandonedOn: null });
  });

  it('should copy no notes, serials or models, and give no GeoJSON without a GPS origin', () => {
    const noted: AsBuilt = {
      ...DEMO_AS_BUILT,
      site: { northAzimuthDeg: 0 },
      runs: DEMO_AS_BUILT.runs.map((r) => ({ ...r, notes: 'staff note' })),
      items: DEMO_AS_BUILT.items.map((i) => ({ ...i, notes: 'staff note', serial: 'SN-123' })),
    };
    const sut = buildSiteMap([source(noted, REV_A)]);
    expect(sut.geojson).toBeNull();
    expect(sut.frame.origin).toBeNull();
    const text = JSON.stringify(sut);
    expect(text).not.toContain('staff note');
    expect(text).not.toContain('SN-123');
  });

  it('should flag a live run with a reading under its depth rule as shallow, with the rule’s cover; an abandoned one never', () => {
    const [first, second, ...rest] = DEMO_AS_BUILT.runs;
    // 0.1 m of cover on a direct-burial run: under the 150 mm of NEC Table 300.5 column 5 the depth rules use
    // (NEC (NFPA 70) 2017/2020 Table 300.5, column 5, direct burial, general location: 6 in / 150 mm).
    const shallow = { ...first!, method: 'direct_burial' as const, location: 'general' as const, isAbandoned: false, depthReadings: [{ stationM: 1, depthM: 0.1 }] };
    const abandoned = { ...second!, method: 'direct_burial' as const, location: 'general' as const, isAbandoned: true, depthReadings: [{ stationM: 1, depthM: 0.1 }] };
    const sut = buildSiteMap([source({ ...DEMO_AS_BUILT, runs: [shallow, abandoned, ...rest] }, REV_A)]);
    const a = sut.runs.find((r) => r.id === shallow.id)!;
    expect(a.isShallow).toBe(true);
    expect(a.minCoverM).toBe(0.15);
    expect(sut.runs.find((r) => r.id === abandoned.id)!.isShallow).toBe(false);
    const demo = buildSiteMap([source(DEMO_AS_BUILT, REV_A)]);
    for (const run of demo.runs) expect(run.isShallow).toBe(run.depthReadings.some((d) => run.minCoverM !== null && d.depthM < run.minCoverM - 0.0005) && !run.isAbandoned);
  });

  it('should answer an empty map for a site without issued revisions', () => {
    expect(buildSiteMap([])).toEqual({ frame: { northAzimuthDeg: 0, origin: null }, revisions: [], referencePoints: [], siteFeatures: [], items: [], runs: [], geojson: null });
  });
});
