import { readFileSync } from 'node:fs';

import { describe, expect, it } from 'vitest';

import type { Run } from '../as-built/run.schema.js';
import type { Finding } from '../analysis/finding.js';
import { checkRunDepth } from './depth-check.js';
import { DepthRuleTableSchema } from './depth-rules.schema.js';
import { DEFAULT_DEPTH_RULES, findDepthRule, NEC_300_5_CLASS1_RULES } from './depth-rules.js';

interface NecFixture {
  source: string;
  columns: string[];
  rows: { location: string; mm: Record<string, number> }[];
}

const nec = JSON.parse(
  readFileSync(new URL('../../../../test/fixtures/reference/burial_depth_nec_300_5.json', import.meta.url), 'utf8'),
) as NecFixture;

const necMm = (row: string, col: number): number => nec.rows.find((r) => r.location === row)!.mm[nec.columns[col - 1]!]!;

describe('DEFAULT_DEPTH_RULES', () => {
  // NEC Table 300.5 (2017/2020), column 5 (≤ 30 V) in mm — used as common practice for Class 2 cable.
  it.each([
    ['direct_burial', 'general', 'all_locations_not_specified_below', 5],
    ['direct_burial', 'under_driveway', 'one_and_two_family_dwelling_driveways_and_outdoor_parking_dwelling_use_only', 5],
    ['direct_burial', 'under_street', 'under_streets_highways_roads_alleys_driveways_parking_lots', 5],
    ['direct_burial', 'trench_below_concrete', 'in_trench_below_2in_concrete_or_equivalent', 5],
    ['direct_burial', 'under_hardscape', 'under_min_4in_concrete_exterior_slab_no_vehicular_traffic_slab_extends_6in_beyond', 5],
  ] as const)('should take %s in %s from NEC 300.5 row %s, column %i', (method, location, row, col) => {
    const rule = findDepthRule(DEFAULT_DEPTH_RULES, method, location)!;
    expect(rule.minCoverM).toBeCloseTo(necMm(row, col) / 1000, 9);
    expect(rule.basis).toBe('common_practice');
    expect(rule.source).toMatch(/300\.5/);
  });

  // NEC Table 300.5 column 5, slab row: 4 in (100 mm) where in a raceway (footnote in the table row).
  it('should allow 100 mm in a sleeve under a slab', () => {
    expect(findDepthRule(DEFAULT_DEPTH_RULES, 'under_hardscape_sleeve', 'under_hardscape')!.minCoverM).toBe(0.1);
  });

  // NEC Table 300.5 columns 1 and 3 for a Class 1 amplifier output (640.9(C)).
  it.each([
    ['direct_burial', 'general', 'all_locations_not_specified_below', 1],
    ['conduit', 'general', 'all_locations_not_specified_below', 3],
    ['conduit', 'trench_below_concrete', 'in_trench_below_2in_concrete_or_equivalent', 3],
    ['direct_burial', 'under_driveway', 'one_and_two_family_dwelling_driveways_and_outdoor_parking_dwelling_use_only', 1],
  ] as const)('should take Class 1 %s in %s from NEC 300.5 row %s, column %i', (method, location, row, col) => {
    expect(findDepthRule(NEC_300_5_CLASS1_RULES, method, location)!.minCoverM).toBeCloseTo(necMm(row, col) / 1000, 9);
  });

  it('should be valid against its own schema', () => {
    expect(DepthRuleTableSchema.safeParse(DEFAULT_DEPTH_RULES).success).toBe(true);
    expect(DepthRuleTableSchema.safeParse(NEC_300_5_CLASS1_RULES).success).toBe(true);
  });

  it('should reject a table with two rules for one method and location, at the second rule', () => {
    const table = { ...DEFAULT_DEPTH_RULES, rules: [...DEFAULT_DEPTH_RULES.rules, DEFAULT_DEPTH_RULES.rules[0]!] };
    const result = DepthRuleTableSchema.safeParse(table);
    expect(result.success ? [] : result.error.issues.map((i) => i.path.join('.'))).toEqual([`rules.${DEFAULT_DEPTH_RULES.rules.length}.location`]);
  });
});

function buried(readings: { stationM: number; depthM: number }[] | undefined, extra: Partial<Run> = {}): Run {
  return {
    id: 'r',
    label: 'Run R',
    fromItemId: 'a',
    toItemId: 'b',
    cableType: '14/2',
    gauge: { system: 'awg', awg: 14 },
    conductors: 2,
    pairs: [],
    measuredLengthM: 20,
    method: 'direct_burial',
    ...(readings === undefined ? {} : { depthReadings: readings }),
    ...extra,
  };
}

describe(checkRunDepth.name, () => {
  it('should report min, max, margins and each shallow station with its path', () => {
    const findings: Finding[] = [];
    const sut = checkRunDepth(
      buried([
        { stationM: 2, depthM: 0.2 },
        { stationM: 8, depthM: 0.12 },
        { stationM: 14, depthM: 0.3 },
      ]),
      7,
      DEFAULT_DEPTH_RULES,
      findings,
    );
    expect(sut).toMatchObject({ status: 'shallow', minDepthM: 0.12, maxDepthM: 0.3, readingCount: 3 });
    expect(sut.worstMarginM).toBeCloseTo(-0.03, 12);
    expect(sut.stations.map((s) => s.marginM)).toEqual([expect.closeTo(0.05, 12), expect.closeTo(-0.03, 12), expect.closeTo(0.15, 12)]);
    expect(findings).toHaveLength(1);
    expect(findings[0]).toMatchObject({ code: 'DEPTH_SHALLOW', severity: 'warning', path: ['runs', 7, 'depthReadings', 1] });
  });

  it.each([
    [0.1524, 'ok'], // exactly 6 in measured with a tape counts as 150 mm cover
    [0.15, 'ok'],
    [0.149, 'shallow'],
  ])('should rate a %f m reading as %s', (depthM, status) => {
    expect(checkRunDepth(buried([{ stationM: 1, depthM }]), 0, DEFAULT_DEPTH_RULES, []).status).toBe(status);
  });

  it('should use the location: 0.3 m is shallow under a dwelling driveway', () => {
    const sut = checkRunDepth(buried([{ stationM: 1, depthM: 0.3 }], { location: 'under_driveway' }), 0, DEFAULT_DEPTH_RULES, []);
    expect(sut.status).toBe('shallow');
    expect(sut.rule!.minCoverM).toBe(0.45);
  });

  it('should ask for readings on a buried run without any', () => {
    const findings: Finding[] = [];
    expect(checkRunDepth(buried(undefined), 2, DEFAULT_DEPTH_RULES, findings).status).toBe('not_recorded');
    expect(findings[0]).toMatchObject({ code: 'DEPTH_NOT_RECORDED', path: ['runs', 2, 'depthReadings'] });
  });

  it('should not check indoor runs', () => {
    const findings: Finding[] = [];
    expect(checkRunDepth(buried(undefined, { method: 'indoor' }), 0, DEFAULT_DEPTH_RULES, findings).status).toBe('not_buried');
    expect(findings).toEqual([]);
  });

  it('should say so when the table has no rule', () => {
    const findings: Finding[] = [];
    const table = { name: 'Empty', rules: [] };
    expect(checkRunDepth(buried([{ stationM: 1, depthM: 0.2 }]), 0, table, findings).status).toBe('no_rule');
    expect(findings[0]!.code).toBe('DEPTH_NO_RULE');
  });

  it('should stay quiet about abandoned runs', () => {
    const findings: Finding[] = [];
    checkRunDepth(buried([{ stationM: 1, depthM: 0.05 }], { isAbandoned: true }), 0, DEFAULT_DEPTH_RULES, findings);
    expect(findings).toEqual([]);
  });
});
