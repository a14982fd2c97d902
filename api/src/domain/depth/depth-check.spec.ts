import { readFileSync } from 'node:fs';

import { describe, expect, it } from 'vitest';

import type { Run } from '../as-built/run.schema.js';
import { type Finding, findingText } from '../analysis/finding.js';
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

/** Our burial locations and the NEC Table 300.5 rows they stand for ([NEC-300.5], docs/reference.md §4). */
const NEC_ROW: Record<string, string> = {
  general: 'all_locations_not_specified_below',
  trench_below_concrete: 'in_trench_below_2in_concrete_or_equivalent',
  under_building: 'under_a_building',
  under_hardscape: 'under_min_4in_concrete_exterior_slab_no_vehicular_traffic_slab_extends_6in_beyond',
  under_street: 'under_streets_highways_roads_alleys_driveways_parking_lots',
  under_driveway: 'one_and_two_family_dwelling_driveways_and_outdoor_parking_dwelling_use_only',
};
const LOCATIONS = Object.keys(NEC_ROW) as (keyof typeof NEC_ROW & Parameters<typeof findDepthRule>[2])[];

describe('DEFAULT_DEPTH_RULES', () => {
  // Every row of the NEC Table 300.5 fixture that a residential run can lie in, both methods, both circuit
  // classes. Up to 30 V: column 5 (common practice for Class 2 cable). Over 30 V: the Class 1 columns,
  // 1 for direct-burial cable and 3 for nonmetallic raceway (common practice, conservative).
  const cases = LOCATIONS.flatMap((location) =>
    (['direct_burial', 'conduit'] as const).flatMap((method) => [
      [method, location, 'up_to_30v', 5] as const,
      [method, location, 'over_30v', method === 'direct_burial' ? 1 : 3] as const,
    ]),
  );
  it.each(cases)('should take %s in %s (%s) from NEC 300.5 column %i', (method, location, circuit, col) => {
    const rule = findDepthRule(DEFAULT_DEPTH_RULES, method, location, circuit)!;
    let expectedMm = necMm(NEC_ROW[location]!, col);
    // Column 5, slab row: 6 in direct, 4 in (100 mm) in a raceway (the row's own note).
    if (col === 5 && location === 'under_hardscape' && method === 'conduit') expectedMm = 100;
    expect(rule.minCoverM).toBeCloseTo(expectedMm / 1000, 9);
    // The NEC sets no cover for Class 2/3 cable: every default is common practice, never "code".
    expect(rule.basis).toBe('common_practice');
    expect(rule.source).toMatch(/300\.5/);
  });

  // NEC Table 300.5 column 5, slab row: 4 in (100 mm) where in a raceway (footnote in the table row).
  it('should allow 100 mm in a sleeve under a slab', () => {
    expect(findDepthRule(DEFAULT_DEPTH_RULES, 'under_hardscape_sleeve', 'under_hardscape')!.minCoverM).toBe(0.1);
  });

  it('should fall back to a rule for any circuit in a company table that names none', () => {
    const table = { name: 'Own', rules: [{ method: 'direct_burial' as const, location: 'general' as const, minCoverM: 0.2, basis: 'company' as const, source: 'Ours' }] };
    expect(findDepthRule(table, 'direct_burial', 'general', 'over_30v')!.minCoverM).toBe(0.2);
    expect(findDepthRule(table, 'direct_burial', 'under_driveway', 'up_to_30v')!.minCoverM).toBe(0.2);
  });

  // NEC Table 300.5 columns 1 and 3 for a Class 1 amplifier output (640.9(C)): every row, code basis.
  it.each(LOCATIONS.flatMap((location) => [['direct_burial', location, 1] as const, ['conduit', location, 3] as const]))(
    'should take Class 1 %s in %s from NEC 300.5 column %i',
    (method, location, col) => {
      const rule = findDepthRule(NEC_300_5_CLASS1_RULES, method, location)!;
      expect(rule.location).toBe(location);
      expect(rule.minCoverM).toBeCloseTo(necMm(NEC_ROW[location]!, col) / 1000, 9);
      expect(rule.basis).toBe('code');
    },
  );

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

  it('should check a 70 V line against the over-30 V cover and ask for the authority having jurisdiction', () => {
    const findings: Finding[] = [];
    const circuit = { circuit: 'over_30v' as const, voltageV: 70.7, description: 'a 70V constant-voltage line' };
    const sut = checkRunDepth(buried([{ stationM: 1, depthM: 0.3 }]), 4, DEFAULT_DEPTH_RULES, findings, circuit);
    // 0.3 m passes column 5 (150 mm) but not column 1 (600 mm).
    expect(sut).toMatchObject({ status: 'shallow', circuit: 'over_30v', circuitVoltageV: 70.7 });
    expect(findings.map((f) => f.code).sort()).toEqual(['DEPTH_RULE_OVER_30V', 'DEPTH_SHALLOW']);
    const over30 = findings.find((f) => f.code === 'DEPTH_RULE_OVER_30V')!;
    expect(over30.message).toMatch(/60 cm of cover.*authority having jurisdiction/);
    // NEC Table 300.5 column 1: 24 in (600 mm); written back in the inches of the table for an imperial reader.
    expect(findingText(over30, 'imperial')).toMatch(/24 in of cover.*authority having jurisdiction/);
  });

  it('should stay quiet about abandoned runs', () => {
    const findings: Finding[] = [];
    checkRunDepth(buried([{ stationM: 1, depthM: 0.05 }], { isAbandoned: true }), 0, DEFAULT_DEPTH_RULES, findings);
    expect(findings).toEqual([]);
  });
});
