import type { AsBuilt } from '../as-built/as-built.schema.js';
import type { ChannelRef } from '../as-built/common.schema.js';
import type { Item } from '../as-built/item.schema.js';
import { fmt, type Finding } from '../analysis/finding.js';
import { solveCircuit } from '../loads/circuit.js';
import { channelKey } from '../loads/channel-circuits.js';
import type { SolvedChannel } from '../loads/channel-analysis.js';
import type { CommissioningCheck } from './commissioning-check.schema.js';

export interface CheckTolerances {
  /**
   * Range of a voice coil's DC resistance as a fraction of its nominal impedance, used when no DC
   * resistance is recorded. Default 0.6–0.95: from memory / common practice (a coil's DC resistance
   * is typically 65–90 % of nominal; IEC 60268-5 keeps the impedance minimum ≥ 80 % of rated).
   */
  dcrFractionOfNominal: { low: number; high: number };
  /** Meter and lead allowance on DC readings: the larger of `ohm` and `fraction`·expected. Default 0.1 Ω / 5 %. */
  dcReadingAllowance: { ohm: number; fraction: number };
  /**
   * Accepted impedance reading as a fraction of the computed load (cable included). Default 0.75–1.25,
   * common practice (a 25 % tap mismatch is "generally considered permissible" on CV lines; a speaker's
   * impedance at 1 kHz sits above its minimum).
   */
  impedanceBand: { low: number; high: number };
  /** Readings below this are a short, ohms. Default 0.5 Ω. */
  shortOhm: number;
  /** Readings above this multiple of the highest expected value are an open circuit. Default 5. */
  openFactor: number;
}

export const DEFAULT_CHECK_TOLERANCES: CheckTolerances = {
  dcrFractionOfNominal: { low: 0.6, high: 0.95 },
  dcReadingAllowance: { ohm: 0.1, fraction: 0.05 },
  impedanceBand: { low: 0.75, high: 1.25 },
  shortOhm: 0.5,
  openFactor: 5,
};

export interface CheckResult {
  checkId: string;
  channel: ChannelRef;
  quantity: CommissioningCheck['quantity'];
  measuredOhm: number;
  /** Best estimate of what the reading should be, ohms (null when not comparable). */
  expectedOhm: number | null;
  /** Accepted range, ohms (null when not comparable). */
  expectedLowOhm: number | null;
  expectedHighOhm: number | null;
  status: 'ok' | 'low' | 'high' | 'short' | 'open' | 'not_comparable';
  /** Plain-English explanation of the result for the crew lead. */
  explanation: string;
}

/** DC resistance range of one item on a channel, ohms, from its recorded DCR or its nominal impedance. */
function itemDcRange(item: Item, nominalLoadOhm: number, tol: CheckTolerances): [number, number, number] {
  let recorded: number | undefined;
  if (item.kind === 'speaker') recorded = item.dcResistanceOhm;
  if (item.kind === 'subwoofer' && item.dcResistanceOhmPerCoil !== undefined) {
    const coil = item.dcResistanceOhmPerCoil;
    recorded =
      item.voiceCoils === 'single' || item.coilWiring === 'separate_channels' ? coil : item.coilWiring === 'series' ? 2 * coil : coil / 2;
  }
  if (recorded !== undefined) return [recorded, recorded, recorded];
  const { low, high } = tol.dcrFractionOfNominal;
  return [nominalLoadOhm * low, nominalLoadOhm * ((low + high) / 2), nominalLoadOhm * high];
}

/**
 * Compares each commissioning reading with what the recorded wiring should read at the amplifier end.
 * DC resistance: the channel's circuit solved with every speaker replaced by its DC resistance (recorded,
 * or a band around nominal) plus every run's loop resistance; both ends of the band are solved exactly
 * (the input resistance rises monotonically with each load). Impedance: the computed load with cable,
 * within `impedanceBand`. Readings outside the band become findings with what they may mean.
 */
export function compareCommissioningChecks(
  asBuilt: AsBuilt,
  solved: readonly SolvedChannel[],
  tol: CheckTolerances,
  findings: Finding[],
): CheckResult[] {
  const byKey = new Map(solved.map((sc) => [channelKey(sc.circuit.channel), sc]));
  return asBuilt.checks.map((check, c) => {
    const sc = byKey.get(channelKey(check.channel));
    const path = ['checks', c, 'measuredOhm'];
    const base = {
      checkId: check.id,
      channel: check.channel,
      quantity: check.quantity,
      measuredOhm: check.measuredOhm,
    };
    if (check.isPolarityOk === false) {
      findings.push({
        code: 'CHECK_POLARITY',
        severity: 'warning',
        message: `Check "${check.id}" found reversed polarity on ${sc?.result.channelName ?? 'the channel'}: swap the conductors at one end so all speakers move together.`,
        path: ['checks', c, 'isPolarityOk'],
        channel: check.channel,
      });
    }
    if (check.isInsulationOk === false) {
      findings.push({
        code: 'CHECK_INSULATION',
        severity: 'critical',
        message: `Check "${check.id}" failed the insulation test on ${sc?.result.channelName ?? 'the channel'}: a conductor leaks to ground or to the other pair — look for a nick, a staple or water in a splice.`,
        path: ['checks', c, 'isInsulationOk'],
        channel: check.channel,
      });
    }
    const notComparable = (explanation: string): CheckResult => {
      findings.push({ code: 'CHECK_NOT_COMPARABLE', severity: 'info', message: `Check "${check.id}": ${explanation}`, path, channel: check.channel });
      return { ...base, expectedOhm: null, expectedLowOhm: null, expectedHighOhm: null, status: 'not_comparable', explanation };
    };
    if (sc === undefined || !sc.result.isSolved) {
      return notComparable('the channel wiring could not be computed (see the wiring findings), so the reading cannot be compared.');
    }
    const isCv = sc.result.mode === 'constant_voltage';
    if (check.quantity === 'dc_resistance' && isCv) {
      return notComparable(
        'DC resistance on a constant-voltage line reads the transformer windings, not the taps; use an impedance meter to check it.',
      );
    }

    let expected: number;
    let low: number;
    let high: number;
    const tree = sc.circuit.tree;
    if (check.quantity === 'dc_resistance') {
      const lows = tree.loadOhm.slice();
      const mids = tree.loadOhm.slice();
      const highs = tree.loadOhm.slice();
      sc.circuit.nodeItemIndex.forEach((itemIdx, node) => {
        const z = tree.loadOhm[node]!;
        if (!Number.isFinite(z)) return;
        const [l, m, h] = itemDcRange(asBuilt.items[itemIdx]!, z, tol);
        lows[node] = l;
        mids[node] = m;
        highs[node] = h;
      });
      const rIn = (loads: number[]): number => solveCircuit({ ...tree, loadOhm: loads }, 1).inputOhm;
      expected = rIn(mids);
      const allowance = (v: number): number => Math.max(tol.dcReadingAllowance.ohm, tol.dcReadingAllowance.fraction * v);
      const lowRaw = rIn(lows);
      const highRaw = rIn(highs);
      low = Math.max(0, lowRaw - allowance(lowRaw));
      high = highRaw + allowance(highRaw);
    } else {
      expected = sc.result.loadOhmWithCable ?? Infinity;
      low = expected * tol.impedanceBand.low;
      high = expected * tol.impedanceBand.high;
    }

    const name = sc.result.channelName;
    const what = check.quantity === 'dc_resistance' ? 'DC resistance' : 'impedance';
    const range = `${fmt(low)}–${fmt(high)} Ω`;
    let status: CheckResult['status'] = 'ok';
    let explanation = `${name} reads ${fmt(check.measuredOhm)} Ω ${what}, within the expected ${range}.`;
    if (!Number.isFinite(expected)) {
      status = check.measuredOhm < tol.shortOhm ? 'short' : 'ok';
      explanation =
        status === 'short'
          ? `${name} has no speaker recorded but reads ${fmt(check.measuredOhm)} Ω: something is shorting the pair.`
          : `${name} has no speaker recorded; the reading of ${fmt(check.measuredOhm)} Ω is not compared.`;
    } else if (check.measuredOhm < tol.shortOhm) {
      status = 'short';
      explanation = `${name} reads ${fmt(check.measuredOhm)} Ω — a short. Look for a nicked cable (a shovel or staple through both conductors), a crushed splice, or strands touching at a terminal. Do not power the amplifier.`;
    } else if (check.measuredOhm > high * tol.openFactor) {
      status = 'open';
      explanation = `${name} reads ${fmt(check.measuredOhm)} Ω against an expected ${range}: the circuit is open. A conductor is cut, a splice has come apart, or a speaker is not connected.`;
    } else if (check.measuredOhm < low) {
      status = 'low';
      explanation = isCv
        ? `${name} reads ${fmt(check.measuredOhm)} Ω, below the expected ${range}: the line is loaded with more tap watts than recorded (a speaker on a higher tap), an extra speaker, or a partial short.`
        : `${name} reads ${fmt(check.measuredOhm)} Ω ${what}, below the expected ${range}: a partial short (a nick or water in a splice), an extra speaker, or speakers wired in parallel where the record says series.`;
    } else if (check.measuredOhm > high) {
      status = 'high';
      explanation = isCv
        ? `${name} reads ${fmt(check.measuredOhm)} Ω, above the expected ${range}: a speaker is disconnected or on a lower tap than recorded, or a splice is poor.`
        : `${name} reads ${fmt(check.measuredOhm)} Ω ${what}, above the expected ${range}: a loose or corroded connection, a speaker not connected, speakers in series where the record says parallel, or a longer or thinner cable than recorded.`;
    }
    if (status !== 'ok' && Number.isFinite(expected)) {
      const isCritical = status === 'short' || status === 'open';
      findings.push({
        code: status === 'short' ? 'CHECK_SHORT' : status === 'open' ? 'CHECK_OPEN' : status === 'low' ? 'CHECK_READING_LOW' : 'CHECK_READING_HIGH',
        severity: isCritical ? 'critical' : 'warning',
        message: explanation,
        path,
        channel: check.channel,
        data: { measuredOhm: check.measuredOhm, expectedOhm: expected, expectedLowOhm: low, expectedHighOhm: high },
      });
    } else if (status === 'short') {
      findings.push({ code: 'CHECK_SHORT', severity: 'critical', message: explanation, path, channel: check.channel });
    }
    const finite = (v: number): number | null => (Number.isFinite(v) ? v : null);
    return { ...base, expectedOhm: finite(expected), expectedLowOhm: finite(low), expectedHighOhm: finite(high), status, explanation };
  });
}
