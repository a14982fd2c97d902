import type { AsBuilt } from '../as-built/as-built.schema.js';
import { fmt, type Finding } from '../analysis/finding.js';
import { standardGaugesLike } from '../cable/run-cable.js';
import { conductorResistanceOhmPerM, formatGauge, gaugeAreaMm2, type ConductorGauge } from '../cable/wire.js';
import { parallelOhm, solveCircuit, type CircuitTree } from './circuit.js';
import { cableLossDb, type SolvedChannel } from './channel-analysis.js';

export interface GaugeSuggestion {
  runId: string;
  installedGauge: ConductorGauge;
  /** Worst cable loss among the loads this run feeds, with the installed gauge, dB. */
  worstLossDbInstalled: number;
  installedMeetsLimit: boolean;
  /**
   * Thinnest standard gauge (same system as installed) that keeps every load this run feeds within the
   * loss limit, the other runs unchanged; null if even the thickest standard gauge cannot.
   */
  suggestedGauge: ConductorGauge | null;
}

function loadNodesBeneath(tree: CircuitTree, node: number): number[] {
  const out: number[] = [];
  const stack = [node];
  while (stack.length > 0) {
    const n = stack.pop()!;
    if (Number.isFinite(tree.loadOhm[n]!)) out.push(n);
    for (const c of tree.children[n]!) stack.push(c);
  }
  return out;
}

/**
 * For every live run on a solved channel, the thinnest standard gauge (AWG 18…8 or 0.75…6 mm²) that
 * keeps the cable loss of every speaker the run feeds at or under `lossLimitDb`, holding the other runs
 * as installed. A run carrying two channels must satisfy both. Exact: each candidate re-solves the
 * channel. Loss falls monotonically with conductor area, so candidates at least as thick as an
 * installed gauge that already passes are accepted without solving.
 */
export function suggestRunGauges(
  asBuilt: AsBuilt,
  solved: readonly SolvedChannel[],
  temperatureC: number,
  lossLimitDb: number,
  findings: Finding[],
): Map<number, GaugeSuggestion> {
  const perRun = new Map<number, { sc: SolvedChannel; node: number; loads: number[] }[]>();
  for (const sc of solved) {
    if (sc.withCable === undefined) continue;
    for (const [r, node] of sc.circuit.runNode) {
      const loads = loadNodesBeneath(sc.circuit.tree, node);
      if (loads.length === 0) continue;
      const list = perRun.get(r);
      if (list === undefined) perRun.set(r, [{ sc, node, loads }]);
      else list.push({ sc, node, loads });
    }
  }

  const suggestions = new Map<number, GaugeSuggestion>();
  for (const [r, entries] of perRun) {
    const run = asBuilt.runs[r]!;
    let worstInstalled = 0;
    for (const { sc, loads } of entries) {
      for (const n of loads) {
        worstInstalled = Math.max(worstInstalled, cableLossDb(sc.withCable!.loadVoltageV[n]!, sc.ideal!.loadVoltageV[n]!));
      }
    }
    const installedMeetsLimit = worstInstalled <= lossLimitDb + 1e-12;
    const installedArea = gaugeAreaMm2(run.gauge);
    let suggestedGauge: ConductorGauge | null = null;
    for (const candidate of standardGaugesLike(run.gauge)) {
      if (installedMeetsLimit && gaugeAreaMm2(candidate) >= installedArea - 1e-12) {
        suggestedGauge = candidate;
        break;
      }
      const ohmPerM = conductorResistanceOhmPerM(candidate, temperatureC);
      const passes = entries.every(({ sc, node, loads }) => {
        const tree = sc.circuit.tree;
        const edges = tree.edgeOhm.slice();
        edges[node] = parallelOhm(
          sc.circuit.nodeEdgeRuns[node]!.map((er) =>
            er.runIndex === r ? (2 * run.measuredLengthM * ohmPerM) / er.pairCount : er.loopOhm,
          ),
        );
        const sol = solveCircuit(tree, sc.voltageV, edges);
        return loads.every((n) => cableLossDb(sol.loadVoltageV[n]!, sc.ideal!.loadVoltageV[n]!) <= lossLimitDb + 1e-12);
      });
      if (passes) {
        suggestedGauge = candidate;
        break;
      }
    }
    suggestions.set(r, { runId: run.id, installedGauge: run.gauge, worstLossDbInstalled: worstInstalled, installedMeetsLimit, suggestedGauge });
    if (suggestedGauge === null) {
      findings.push({
        code: 'NO_GAUGE_MEETS_LOSS_LIMIT',
        severity: 'info',
        message:
          `No standard gauge on run "${run.label}" alone brings the speakers it feeds within ${fmt(lossLimitDb)} dB ` +
          `(worst now ${fmt(worstInstalled)} dB with ${formatGauge(run.gauge)}). The loss sits in other runs or the load is very low: ` +
          'upsize the trunk too, raise the speaker impedance, or consider a constant-voltage line.',
        path: ['runs', r, 'gauge'],
        runId: run.id,
      });
    }
  }
  return suggestions;
}
