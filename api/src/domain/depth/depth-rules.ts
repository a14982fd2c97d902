import type { BurialLocation, InstallMethod } from '../as-built/run.schema.js';
import type { CircuitClass, DepthRule, DepthRuleTable } from './depth-rules.schema.js';

/** NEC Table 300.5 gives its own metric values (6 in → 150 mm, not 152.4); we use them. */
const NEC_MM_BY_INCHES: Record<number, number> = { 0: 0, 4: 100, 6: 150, 12: 300, 18: 450, 24: 600 };

/**
 * The inches a cover rule was written in, when `minCoverM` is one of the NEC's metric equivalents above
 * (150 mm is the code's 6 in, not 5 7/8 in): imperial screens show and compare against that value.
 */
export function nominalCoverInches(minCoverM: number): number | undefined {
  const mm = Math.round(minCoverM * 1000 * 10) / 10;
  const hit = Object.entries(NEC_MM_BY_INCHES).find(([, value]) => value === mm);
  return hit === undefined ? undefined : Number(hit[0]);
}

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
    circuit: 'up_to_30v',
    minCoverM: necCoverM(inches),
    basis: 'common_practice',
    source: `${CLASS2}: ${NEC_TABLE}, column 5, "${row}": ${inches} in (${necCoverM(inches) * 1000} mm).`,
  };
}

const OVER_30V =
  'Over 30 V, where column 5 does not apply and the NEC sets no cover for Class 2/3 lines. Common practice, ' +
  'conservative: the cover Class 1 wiring would need; confirm with the authority having jurisdiction';

function over30(method: InstallMethod, location: BurialLocation, inches: number, column: 1 | 3, row: string): DepthRule {
  return {
    method,
    location,
    circuit: 'over_30v',
    minCoverM: necCoverM(inches),
    basis: 'common_practice',
    source: `${OVER_30V}: ${NEC_TABLE}, column ${column}, "${row}": ${inches} in (${necCoverM(inches) * 1000} mm).`,
  };
}

const UNDER_BUILDING =
  'NEC Table 300.5, "under a building": 0 in, only in a raceway or cable identified for direct burial. The NEC sets no ' +
  'cover for Class 2/3 cable; common practice keeps it in a raceway there';

/**
 * Default depth rules for residential speaker cable, by the circuit the run carries. The NEC sets no cover
 * for Class 2/3 cable; every default here is **common practice** built on NEC Table 300.5 with the table's
 * own metric values:
 * - circuits up to 30 V (low-impedance speaker lines of up to 30 V, 25 V constant-voltage lines): column 5
 *   (≤ 30 V landscape/irrigation control) — 6 in / 150 mm in general and under a slab without vehicles
 *   (4 in / 100 mm in a raceway), 18 in / 450 mm under a dwelling's driveway, 24 in / 600 mm under streets;
 * - circuits over 30 V (70 V and 100 V constant-voltage lines, stronger low-impedance outputs), where column
 *   5 does not apply: the conservative cover Class 1 wiring would need (column 1 for direct-burial cable,
 *   column 3 for nonmetallic raceway), with a finding that asks the crew to confirm with the authority
 *   having jurisdiction.
 * Indoor runs are not checked. Companies edit their own copy; a Class 1 amplifier output needs
 * {@link NEC_300_5_CLASS1_RULES}.
 */
export const DEFAULT_DEPTH_RULES: DepthRuleTable = {
  name: 'Speaker cable by circuit (common practice on NEC Table 300.5: column 5 up to 30 V, columns 1 and 3 above)',
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
    over30('direct_burial', 'general', 24, 1, 'all locations not specified'),
    over30('direct_burial', 'under_hardscape', 18, 1, 'under ≥ 4 in exterior slab, no vehicles'),
    over30('direct_burial', 'trench_below_concrete', 18, 1, 'in trench below ≥ 2 in concrete'),
    over30('direct_burial', 'under_driveway', 18, 1, 'one- and two-family dwelling driveways'),
    over30('direct_burial', 'under_street', 24, 1, 'streets, roads, alleys, driveways, parking lots'),
    over30('conduit', 'general', 18, 3, 'all locations not specified'),
    over30('conduit', 'under_hardscape', 4, 3, 'under ≥ 4 in exterior slab, no vehicles'),
    over30('conduit', 'trench_below_concrete', 12, 3, 'in trench below ≥ 2 in concrete'),
    over30('conduit', 'under_driveway', 18, 3, 'one- and two-family dwelling driveways'),
    over30('conduit', 'under_street', 24, 3, 'streets, roads, alleys, driveways, parking lots'),
    over30('under_hardscape_sleeve', 'general', 4, 3, 'under ≥ 4 in exterior slab, no vehicles'),
    over30('under_hardscape_sleeve', 'under_hardscape', 4, 3, 'under ≥ 4 in exterior slab, no vehicles'),
    over30('under_hardscape_sleeve', 'under_driveway', 18, 3, 'one- and two-family dwelling driveways'),
    over30('under_hardscape_sleeve', 'under_street', 24, 3, 'streets, roads, alleys, driveways, parking lots'),
    { method: 'direct_burial', location: 'under_building', minCoverM: 0, basis: 'common_practice', source: `${UNDER_BUILDING}.` },
    { method: 'conduit', location: 'under_building', minCoverM: 0, basis: 'common_practice', source: `${UNDER_BUILDING}.` },
    { method: 'under_hardscape_sleeve', location: 'under_building', minCoverM: 0, basis: 'common_practice', source: `${UNDER_BUILDING}.` },
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
    col('direct_burial', 'under_building', 0, 'column 1', 'under a building (only in a raceway or cable identified for direct burial)'),
    col('conduit', 'under_building', 0, 'column 3', 'under a building'),
    col('under_hardscape_sleeve', 'under_building', 0, 'column 3', 'under a building'),
    { method: 'indoor', location: 'general', minCoverM: null, basis: 'common_practice', source: 'Indoor runs are not buried; no cover applies.' },
  ],
};

/**
 * The rule for a method, location and circuit class: the exact match for the circuit, else the location's
 * rule for any circuit, else the same two for the method's 'general' location, else undefined (no rule —
 * reported to the user, not guessed).
 */
export function findDepthRule(
  table: DepthRuleTable,
  method: InstallMethod,
  location: BurialLocation,
  circuit: CircuitClass = 'up_to_30v',
): DepthRule | undefined {
  const at = (where: BurialLocation): DepthRule | undefined =>
    table.rules.find((r) => r.method === method && r.location === where && r.circuit === circuit) ??
    table.rules.find((r) => r.method === method && r.location === where && r.circuit === undefined);
  return at(location) ?? at('general');
}
