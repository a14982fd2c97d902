import type { BurialLocation, InstallMethod, Run } from '../as-built/run.schema.js';
import { composeMessage, type Finding, qty } from '../analysis/finding.js';
import type { CircuitClass, DepthRule, DepthRuleTable } from './depth-rules.schema.js';
import { findDepthRule } from './depth-rules.js';

export interface DepthStationResult {
  /** Index into the run's depthReadings. */
  readingIndex: number;
  stationM: number;
  depthM: number;
  /** depth − minimum cover, metres (negative = too shallow); null without a rule. */
  marginM: number | null;
}

/** What a run carries, for the depth rules (see `CircuitClassSchema`). */
export interface RunCircuit {
  circuit: CircuitClass;
  /** Highest voltage on the run's pairs, V rms (line voltage or the amplifier's rated output); null for a spare. */
  voltageV: number | null;
  /** Plain words for the finding, e.g. "a 70V constant-voltage line". */
  description: string;
}

export const SPARE_CIRCUIT: RunCircuit = { circuit: 'up_to_30v', voltageV: null, description: 'nothing (no channel on its pairs)' };

export interface RunDepthResult {
  runId: string;
  method: InstallMethod;
  location: BurialLocation;
  circuit: CircuitClass;
  circuitVoltageV: number | null;
  rule: DepthRule | null;
  status: 'ok' | 'shallow' | 'not_recorded' | 'not_buried' | 'no_rule';
  readingCount: number;
  minDepthM: number | null;
  maxDepthM: number | null;
  /** Smallest margin over the run, metres (negative = too shallow somewhere). */
  worstMarginM: number | null;
  stations: DepthStationResult[];
  shallowStations: DepthStationResult[];
}

/**
 * Checks one run's depth readings (cover, metres) against the rule table: min/max depth, margin at each
 * station, shallow stations. Findings: DEPTH_SHALLOW per station under the minimum (warning), DEPTH_NOT_RECORDED
 * for a buried live run without readings (warning), DEPTH_NO_RULE when the table has no rule (info).
 * Indoor runs (rule with null cover) are 'not_buried'. Abandoned runs are reported but raise no findings.
 */
export function checkRunDepth(
  run: Run,
  runIndex: number,
  table: DepthRuleTable,
  findings: Finding[],
  circuit: RunCircuit = SPARE_CIRCUIT,
): RunDepthResult {
  const location = run.location ?? 'general';
  const rule = findDepthRule(table, run.method, location, circuit.circuit) ?? null;
  const readings = run.depthReadings ?? [];
  const minCover = rule?.minCoverM ?? null;
  const stations: DepthStationResult[] = readings.map((r, i) => ({
    readingIndex: i,
    stationM: r.stationM,
    depthM: r.depthM,
    marginM: minCover === null ? null : r.depthM - minCover,
  }));
  const depths = readings.map((r) => r.depthM);
  const minDepthM = depths.length > 0 ? Math.min(...depths) : null;
  const maxDepthM = depths.length > 0 ? Math.max(...depths) : null;
  // A tolerance of 0.5 mm keeps a reading entered as 6 in (0.1524 m) or 0.15 m from failing by rounding.
  const shallowStations = stations.filter((s) => s.marginM !== null && s.marginM < -0.0005);
  const worstMarginM = minCover === null || minDepthM === null ? null : minDepthM - minCover;
  const result: RunDepthResult = {
    runId: run.id,
    method: run.method,
    location,
    circuit: circuit.circuit,
    circuitVoltageV: circuit.voltageV,
    rule,
    status: 'ok',
    readingCount: readings.length,
    minDepthM,
    maxDepthM,
    worstMarginM,
    stations,
    shallowStations,
  };
  const isQuiet = run.isAbandoned === true;

  if (rule === null) {
    result.status = 'no_rule';
    if (!isQuiet && run.method !== 'indoor') {
      findings.push({
        code: 'DEPTH_NO_RULE',
        severity: 'info',
        message: `The depth rule table has no rule for ${run.method.replaceAll('_', ' ')} in ${location.replaceAll('_', ' ')}; run "${run.label}" was not checked.`,
        path: ['runs', runIndex, 'location'],
        runId: run.id,
      });
    }
    return result;
  }
  if (rule.minCoverM === null) {
    result.status = 'not_buried';
    return result;
  }
  if (circuit.circuit === 'over_30v' && !isQuiet) {
    findings.push({
      code: 'DEPTH_RULE_OVER_30V',
      severity: 'info',
      ...composeMessage`Run "${run.label}" carries ${circuit.description}, above the 30 V that NEC Table 300.5 column 5 covers; it is checked against ${qty.ruleDepth(rule.minCoverM)} of cover${rule.circuit === 'over_30v' ? ', the conservative cover Class 1 wiring would need' : ''}. Confirm the cover required here with the authority having jurisdiction.`,
      path: ['runs', runIndex, 'method'],
      runId: run.id,
      data: { voltageV: circuit.voltageV, minCoverM: rule.minCoverM },
    });
  }
  if (readings.length === 0) {
    result.status = 'not_recorded';
    if (!isQuiet) {
      findings.push({
        code: 'DEPTH_NOT_RECORDED',
        severity: 'warning',
        message: `Run "${run.label}" is buried but has no depth readings. Record the cover at a few stations before backfill — afterwards nobody can.`,
        path: ['runs', runIndex, 'depthReadings'],
        runId: run.id,
      });
    }
    return result;
  }
  if (shallowStations.length > 0) {
    result.status = 'shallow';
    if (!isQuiet) {
      for (const s of shallowStations) {
        findings.push({
          code: 'DEPTH_SHALLOW',
          severity: 'warning',
          ...composeMessage`Run "${run.label}" has ${qty.depth(s.depthM)} of cover at ${qty.length(s.stationM)} from its start; the rule for ${run.method.replaceAll('_', ' ')} in ${location.replaceAll('_', ' ')} is ${qty.ruleDepth(rule.minCoverM)}, ${qty.depth(-s.marginM!)} short. Bury it deeper or protect it (sleeve) at that spot.`,
          path: ['runs', runIndex, 'depthReadings', s.readingIndex],
          runId: run.id,
          data: { depthM: s.depthM, minCoverM: rule.minCoverM, marginM: s.marginM, stationM: s.stationM, basis: rule.basis },
        });
      }
    }
  }
  return result;
}
