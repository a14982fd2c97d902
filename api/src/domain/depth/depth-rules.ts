import type { BurialLocation, InstallMethod } from '../as-built/run.schema.js';
import type { DepthRule, DepthRuleTable } from './depth-rules.schema.js';

/** NEC Table 300.5 gives its own metric values (6 in → 150 mm, not 152.4); we use them. */
const NEC_MM_BY_INCHES: Record<number, number> = { 0: 0, 4: 100, 6: 150, 12: 300, 18: 450, 24: 600 };

function necCoverM(inches: number): number {
  const mm = NEC_MM_BY_INCHES[inches];
  if (mm === undefined) throw new RangeError(`no NEC metric value for ${inches} in`);
  return mm / 1000;
}

const NEC_TABLE = 'NEC (NFPA 70) 2017/2020 Table 300.5 (same values in 2023, there cited as 300.5(A))';
const CLASS2 =
  'The NEC sets no minimum cover for Class 2/3 audio cable (2017/2020 725.3 does not reference 300.5; 2023 Art. 722/725 likewise). ' +
  'Common practice: use Table 300.5 column 5 (circuits ≤ 30 V) as the reference';

function col5(method: InstallMethod, location: BurialLocation, inches: number, row: string): DepthRule {
  return {
    method,
    location,
    minCoverM: necCoverM(inches),
    basis: 'common_practice',
    source: `${CLASS2}: ${NEC_TABLE}, column 5, "${row}": ${inches} in (${necCoverM(inches) * 1000} mm).`,
  };
}

/**
 * Default depth rules for low-voltage (Class 2) speaker cable in residential work. The NEC sets no
 * cover for Class 2; every default here is **common practice** that borrows NEC Table 300.5 column 5
 * (≤ 30 V landscape/irrigation control) with the table's own metric values: 6 in / 150 mm in general
 * locations and under a slab without vehicles (4 in / 100 mm where in a raceway), 18 in / 450 mm
 * under a dwelling's driveway, 24 in / 600 mm under streets. Indoor runs are not checked.
 * Companies edit their own copy; a Class 1 amplifier output needs {@link NEC_300_5_CLASS1_RULES}.
 */
export const DEFAULT_DEPTH_RULES: DepthRuleTable = {
  name: 'Low-voltage speaker cable (common practice, NEC Table 300.5 column 5 as reference)',
  rules: [
    col5('direct_burial', 'general', 6, 'all locations not specified'),
    col5('direct_burial', 'under_hardscape', 6, 'under ≥ 4 in exterior slab, no vehicles (direct burial)'),
    col5('direct_burial', 'trench_below_concrete', 6, 'in trench below ≥ 2 in concrete'),
    col5('direct_burial', 'under_driveway', 18, 'one- and two-family dwelling driveways'),
    col5('direct_burial', 'under_street', 24, 'streets, roads, alleys, driveways, parking lots'),
    col5('conduit', 'general', 6, 'all locations not specified'),
    col5('conduit', 'under_hardscape', 4, 'under ≥ 4 in exterior slab, no vehicles (in raceway)'),
    col5('conduit', 'trench_below_concrete', 6, 'in trench below ≥ 2 in concrete'),
    col5('conduit', 'under_driveway', 18, 'one- and two-family dwelling driveways'),
    col5('conduit', 'under_street', 24, 'streets, roads, alleys, driveways, parking lots'),
    col5('under_hardscape_sleeve', 'general', 4, 'under ≥ 4 in exterior slab, no vehicles (in raceway)'),
    col5('under_hardscape_sleeve', 'under_hardscape', 4, 'under ≥ 4 in exterior slab, no vehicles (in raceway)'),
    col5('under_hardscape_sleeve', 'under_driveway', 18, 'one- and two-family dwelling driveways'),
    col5('under_hardscape_sleeve', 'under_street', 24, 'streets, roads, alleys, driveways, parking lots'),
    { method: 'direct_burial', location: 'under_building', minCoverM: 0, basis: 'code', source: `${NEC_TABLE}, "under a building": 0 in (only in a raceway or cable identified for direct burial).` },
    { method: 'conduit', location: 'under_building', minCoverM: 0, basis: 'code', source: `${NEC_TABLE}, "under a building": 0 in.` },
    { method: 'indoor', location: 'general', minCoverM: null, basis: 'common_practice', source: 'Indoor runs are not buried; no cover applies.' },
  ],
};

function col(method: InstallMethod, location: BurialLocation, inches: number, column: string, row: string): DepthRule {
  return {
    method,
    location,
    minCoverM: necCoverM(inches),
    basis: 'code',
    source: `${NEC_TABLE}, ${column}, "${row}": ${inches} in. Applies when the amplifier output is marked Class 1 (NEC 640.9(C)).`,
  };
}

/**
 * NEC Table 300.5 for a Class 1 amplifier output (Chapter 3 wiring methods apply): direct-burial cable
 * column 1, raceway column 3 (nonmetallic listed for direct burial).
 */
export const NEC_300_5_CLASS1_RULES: DepthRuleTable = {
  name: 'NEC Table 300.5, Class 1 amplifier output (columns 1 and 3)',
  rules: [
    col('direct_burial', 'general', 24, 'column 1', 'all locations not specified'),
    col('direct_burial', 'trench_below_concrete', 18, 'column 1', 'in trench below ≥ 2 in concrete'),
    col('direct_burial', 'under_hardscape', 18, 'column 1', 'under ≥ 4 in exterior slab, no vehicles'),
    col('direct_burial', 'under_driveway', 18, 'column 1', 'one- and two-family dwelling driveways'),
    col('direct_burial', 'under_street', 24, 'column 1', 'streets, roads, alleys, driveways, parking lots'),
    col('conduit', 'general', 18, 'column 3', 'all locations not specified'),
    col('conduit', 'trench_below_concrete', 12, 'column 3', 'in trench below ≥ 2 in concrete'),
    col('conduit', 'under_hardscape', 4, 'column 3', 'under ≥ 4 in exterior slab, no vehicles'),
    col('conduit', 'under_driveway', 18, 'column 3', 'one- and two-family dwelling driveways'),
    col('conduit', 'under_street', 24, 'column 3', 'streets, roads, alleys, driveways, parking lots'),
    col('under_hardscape_sleeve', 'under_hardscape', 4, 'column 3', 'under ≥ 4 in exterior slab, no vehicles'),
    { method: 'indoor', location: 'general', minCoverM: null, basis: 'common_practice', source: 'Indoor runs are not buried; no cover applies.' },
  ],
};

/**
 * The rule for a method and location: the exact match, else the method's 'general' rule, else
 * undefined (no rule — reported to the user, not guessed).
 */
export function findDepthRule(
  table: DepthRuleTable,
  method: InstallMethod,
  location: BurialLocation,
): DepthRule | undefined {
  return (
    table.rules.find((r) => r.method === method && r.location === location) ??
    table.rules.find((r) => r.method === method && r.location === 'general')
  );
}
