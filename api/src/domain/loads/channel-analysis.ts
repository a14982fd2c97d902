import type { AsBuilt } from '../as-built/as-built.schema.js';
import type { ChannelRef } from '../as-built/common.schema.js';
import type { AmplifierChannel, AmplifierItem, ItemKind } from '../as-built/item.schema.js';
import { fmt, type Finding } from '../analysis/finding.js';
import { solveCircuit, type CircuitSolution } from './circuit.js';
import type { ChannelCircuit } from './channel-circuits.js';
import { checkCvLoad, cvLineVoltageV, type CvLoadCheck } from './constant-voltage.js';

export interface ChannelAnalysisOptions {
  /** Largest acceptable cable loss at any speaker, dB (positive). */
  lossLimitDb: number;
  /** A channel load below this, ohms, is reported as a short. */
  shortThresholdOhm: number;
  /** Largest fraction of a CV amplifier's rating the taps may use (common practice 0.8). */
  cvMaxLoadFraction: number;
}

/** How the amplifier's output voltage was chosen. */
export type OutputBasis = 'rated_8_ohm' | 'rated_4_ohm' | 'cv_line';

/**
 * Output voltage, volts rms, at which a channel is analysed: the amp's rated output as an ideal voltage
 * source. Low-impedance channels: V = √(P·Z) from the rating of the load's class — the 8 Ω rating when
 * the nominal load is 8 Ω or more (or no 4 Ω rating is published), otherwise the 4 Ω rating. Amplifiers
 * rarely double their power into half the impedance, so the 4 Ω figure gives the (lower) voltage the amp
 * actually holds into lower loads. Constant-voltage channels: the line voltage.
 */
export function ratedOutputVoltage(
  amplifier: AmplifierItem,
  channel: AmplifierChannel,
  nominalLoadOhm: number,
): { voltageV: number; basis: OutputBasis } {
  if (channel.constantVoltage !== undefined) {
    return { voltageV: cvLineVoltageV(channel.constantVoltage.lineVoltage), basis: 'cv_line' };
  }
  if (nominalLoadOhm >= 8 || amplifier.ratedWatts4Ohm === undefined) {
    return { voltageV: Math.sqrt(amplifier.ratedWatts8Ohm * 8), basis: 'rated_8_ohm' };
  }
  return { voltageV: Math.sqrt(amplifier.ratedWatts4Ohm * 4), basis: 'rated_4_ohm' };
}

/**
 * Cable loss of a load, dB, positive = quieter: −20·log10(V_with_cable / V_ideal_cable) at the same
 * amplifier output voltage. 0 when the ideal voltage is 0 (an open branch). Unrounded.
 */
export function cableLossDb(voltageWithCableV: number, voltageIdealV: number): number {
  if (voltageIdealV <= 0) return 0;
  if (voltageWithCableV <= 0) return Infinity;
  return -20 * Math.log10(voltageWithCableV / voltageIdealV);
}

export interface NodeResult {
  itemId: string;
  kind: ItemKind;
  parentItemId: string | null;
  /** Runs between the parent and this item (several = in parallel). */
  runIds: string[];
  /** Loop resistance of the run(s) into this item, ohms. */
  runLoopOhm: number;
  /** Current in the run(s) into this item, A. */
  branchCurrentA: number;
  /** Voltage at this item's terminals, V rms. */
  terminalVoltageV: number;
  /** Impedance of this item and everything beyond it, ohms (with cable); null = open. */
  impedanceBeyondOhm: number | null;
}

export interface LoadResult {
  itemId: string;
  label: string;
  kind: ItemKind;
  /** Nominal impedance the item presents on this channel, ohms. */
  loadOhm: number;
  /** Runs from the amplifier to this item, in order. */
  runIds: string[];
  voltageV: number;
  currentA: number;
  /** Power into the load at the amp's rated output, W. */
  powerW: number;
  /** Power it would get with zero-resistance cable at the same amp voltage, W. */
  idealPowerW: number;
  /** Cable loss, dB (positive = quieter). */
  cableLossDb: number;
  /**
   * Level drop at the speaker expressed as power: how much less power it gets than with ideal cable at the
   * same amplifier voltage, % (100·(1 − P/P_ideal)). Not the share of the amplifier's output dissipated in
   * the cable (that is the channel's `cableDissipationPct`).
   */
  powerLossPct: number;
  /** CV tap watts, for a constant-voltage speaker. */
  tapWatts?: number;
}

export interface ChannelLoadResult {
  channel: ChannelRef;
  channelName: string;
  mode: 'low_impedance' | 'constant_voltage';
  /** False when the wiring has a loop: nothing below is computed. */
  isSolved: boolean;
  outputVoltageV: number;
  outputBasis: OutputBasis;
  /** Load seen by the channel with ideal cable (speakers only), ohms; null = open (nothing connected). */
  loadOhmNominal: number | null;
  /** Load seen by the channel including every run's loop resistance, ohms; null = open. */
  loadOhmWithCable: number | null;
  minimumImpedanceOhm: number;
  /** Power the amplifier delivers at the analysis voltage, W. */
  amplifierOutputW: number;
  /** Power lost in all runs of the channel, W, and as % of the amplifier's output. */
  cableDissipationW: number;
  cableDissipationPct: number;
  cv?: CvLoadCheck & { lineVoltageV: number };
  nodes: NodeResult[];
  loads: LoadResult[];
}

/** Solved circuit plus its ideal-cable twin, kept for gauge suggestions. */
export interface SolvedChannel {
  circuit: ChannelCircuit;
  result: ChannelLoadResult;
  withCable?: CircuitSolution;
  ideal?: CircuitSolution;
  voltageV: number;
}

/** JSON has no Infinity: open circuits are reported as null. */
export function finiteOrNull(value: number): number | null {
  return Number.isFinite(value) ? value : null;
}

const ZERO_EDGES_CACHE = new Map<number, number[]>();
function zeroEdges(n: number): number[] {
  let z = ZERO_EDGES_CACHE.get(n);
  if (z === undefined) {
    z = new Array<number>(n).fill(0);
    if (ZERO_EDGES_CACHE.size < 64) ZERO_EDGES_CACHE.set(n, z);
  }
  return z;
}

/** Solves the circuit with ideal cable (all run resistances zero) at `voltageV`. */
export function solveIdeal(circuit: ChannelCircuit, voltageV: number): CircuitSolution {
  return solveCircuit(circuit.tree, voltageV, zeroEdges(circuit.tree.parent.length));
}

/**
 * Solves one channel: load with and without cable, voltage and current at every item, power and cable
 * loss at every speaker at the amp's rated output; returns findings for load below the amp's minimum,
 * shorts, open channels and dead-end branches, losses over the limit and constant-voltage problems.
 */
export function analyzeChannel(
  asBuilt: AsBuilt,
  circuit: ChannelCircuit,
  options: ChannelAnalysisOptions,
  findings: Finding[],
): SolvedChannel {
  const { amplifier, channelDef, channel, tree, nodeItemIndex } = circuit;
  const channelName = `${amplifier.label} / ${channelDef.name}`;
  const mode = channelDef.constantVoltage === undefined ? 'low_impedance' : 'constant_voltage';
  const base: ChannelLoadResult = {
    channel,
    channelName,
    mode,
    isSolved: false,
    outputVoltageV: 0,
    outputBasis: mode === 'constant_voltage' ? 'cv_line' : 'rated_8_ohm',
    loadOhmNominal: null,
    loadOhmWithCable: null,
    minimumImpedanceOhm: amplifier.minimumImpedanceOhm,
    amplifierOutputW: 0,
    cableDissipationW: 0,
    cableDissipationPct: 0,
    nodes: [],
    loads: [],
  };
  findings.push(...circuit.findings);
  if (circuit.hasLoop) return { circuit, result: base, voltageV: 0 };

  // The load class (and so the output voltage) follows the nominal load; solve ideal at 1 V first.
  const unit = solveIdeal(circuit, 1);
  const { voltageV, basis } = ratedOutputVoltage(amplifier, channelDef, unit.inputOhm);
  const ideal = solveIdeal(circuit, voltageV);
  const withCable = solveCircuit(tree, voltageV);
  const channelDissipationPct = withCable.sourcePowerW > 0 ? (100 * withCable.cablePowerW) / withCable.sourcePowerW : 0;

  const nodes: NodeResult[] = [];
  const loads: LoadResult[] = [];
  const runIdsToNode: string[][] = new Array<string[]>(tree.parent.length);
  runIdsToNode[0] = [];
  for (const node of tree.order) {
    const item = asBuilt.items[nodeItemIndex[node]!]!;
    const p = tree.parent[node]!;
    const edgeRunIds = circuit.nodeEdgeRuns[node]!.map((er) => asBuilt.runs[er.runIndex]!.id);
    if (p >= 0) runIdsToNode[node] = [...runIdsToNode[p]!, ...edgeRunIds];
    nodes.push({
      itemId: item.id,
      kind: item.kind,
      parentItemId: p < 0 ? null : asBuilt.items[nodeItemIndex[p]!]!.id,
      runIds: edgeRunIds,
      runLoopOhm: tree.edgeOhm[node]!,
      branchCurrentA: withCable.branchCurrentA[node]!,
      terminalVoltageV: withCable.terminalVoltageV[node]!,
      impedanceBeyondOhm: finiteOrNull(withCable.subtreeOhm[node]!),
    });
    if (p < 0) continue;
    const loadOhm = tree.loadOhm[node]!;
    if (!Number.isFinite(loadOhm)) {
      if (tree.children[node]!.length === 0 && item.kind !== 'amplifier') {
        const isSpareEnd = item.kind === 'spare_end';
        findings.push({
          code: 'BRANCH_ENDS_WITHOUT_LOAD',
          severity: isSpareEnd && item.isCapped ? 'info' : 'warning',
          message: isSpareEnd
            ? `${channelName} is live at spare end "${item.label}" with no speaker beyond it${item.isCapped ? '' : ' and the end is not recorded as capped — insulate both conductors separately'}.`
            : `${channelName} runs to "${item.label}" and stops there: nothing beyond it is connected. That is an open branch — a missing run in the record or an unconnected splice.`,
          path: ['items', nodeItemIndex[node]!],
          itemId: item.id,
          channel,
        });
      }
      continue;
    }
    const v = withCable.loadVoltageV[node]!;
    const vIdeal = ideal.loadVoltageV[node]!;
    const powerW = withCable.loadPowerW[node]!;
    const idealPowerW = ideal.loadPowerW[node]!;
    const load: LoadResult = {
      itemId: item.id,
      label: item.label,
      kind: item.kind,
      loadOhm,
      runIds: runIdsToNode[node]!,
      voltageV: v,
      currentA: withCable.loadCurrentA[node]!,
      powerW,
      idealPowerW,
      cableLossDb: cableLossDb(v, vIdeal),
      powerLossPct: idealPowerW > 0 ? 100 * (1 - powerW / idealPowerW) : 0,
    };
    if (item.kind === 'speaker' && item.constantVoltage !== undefined) load.tapWatts = item.constantVoltage.tapWatts;
    loads.push(load);

    if (load.cableLossDb > options.lossLimitDb + 1e-12) {
      findings.push({
        code: 'CABLE_LOSS_OVER_LIMIT',
        severity: 'warning',
        // Two meanings of "power lost", each named (defined once in the Engineering notes): the level drop
        // at the speaker against ideal cable at the same amplifier voltage, and the share of the
        // amplifier's output dissipated in the channel's cable (the figure the trade's tables quote).
        message:
          `"${item.label}" on ${channelName}: level drop at the speaker ${fmt(load.cableLossDb)} dB ` +
          `(${fmt(load.powerLossPct, 1)} % less power than with ideal cable); the channel's cable dissipates ` +
          `${fmt(channelDissipationPct, 1)} % of the amplifier's output. The limit is ${fmt(options.lossLimitDb)} dB of level drop. ` +
          'A heavier gauge on the runs feeding it brings it back — see the suggested gauges.',
        path: ['items', nodeItemIndex[node]!],
        itemId: item.id,
        channel,
        data: {
          cableLossDb: load.cableLossDb,
          powerLossPct: load.powerLossPct,
          cableDissipationPct: channelDissipationPct,
          limitDb: options.lossLimitDb,
        },
      });
    }
    checkCvCompatibility(item, channelDef, channelName, channel, nodeItemIndex[node]!, findings);
  }

  const result: ChannelLoadResult = {
    ...base,
    isSolved: true,
    outputVoltageV: voltageV,
    outputBasis: basis,
    loadOhmNominal: finiteOrNull(ideal.inputOhm),
    loadOhmWithCable: finiteOrNull(withCable.inputOhm),
    amplifierOutputW: withCable.sourcePowerW,
    cableDissipationW: withCable.cablePowerW,
    cableDissipationPct: channelDissipationPct,
    nodes,
    loads,
  };

  const ampPath = ['items', circuit.amplifierIndex];
  if (tree.parent.length > 1 && !Number.isFinite(ideal.inputOhm)) {
    findings.push({
      code: 'CHANNEL_OPEN',
      severity: 'warning',
      message: `${channelName} has runs connected but no speaker on them: the channel is an open circuit.`,
      path: ampPath,
      itemId: amplifier.id,
      channel,
    });
  } else if (withCable.inputOhm < options.shortThresholdOhm) {
    findings.push({
      code: 'CHANNEL_SHORT',
      severity: 'critical',
      message: `${channelName} sees only ${fmt(withCable.inputOhm, 3)} Ω — effectively a short. Do not power the amplifier until the wiring is checked.`,
      path: ampPath,
      itemId: amplifier.id,
      channel,
      data: { loadOhm: withCable.inputOhm },
    });
  } else if (mode === 'low_impedance' && ideal.inputOhm < amplifier.minimumImpedanceOhm * (1 - 1e-9)) {
    findings.push({
      code: 'LOAD_BELOW_AMP_MINIMUM',
      severity: 'critical',
      message:
        `${channelName} drives ${fmt(ideal.inputOhm)} Ω of speakers (${fmt(withCable.inputOhm)} Ω with the cable), below the amplifier's ` +
        `${fmt(amplifier.minimumImpedanceOhm)} Ω minimum. Rewire some speakers in series, use higher-impedance speakers, or move some to another channel.`,
      path: ampPath,
      itemId: amplifier.id,
      channel,
      data: { loadOhmNominal: ideal.inputOhm, loadOhmWithCable: withCable.inputOhm, minimumOhm: amplifier.minimumImpedanceOhm },
    });
  }

  if (channelDef.constantVoltage !== undefined) {
    const lineVoltageV = cvLineVoltageV(channelDef.constantVoltage.lineVoltage);
    const taps = loads.map((l) => l.tapWatts).filter((w): w is number => w !== undefined);
    const cv = checkCvLoad(lineVoltageV, taps, channelDef.constantVoltage.ratedWatts, options.cvMaxLoadFraction);
    result.cv = { ...cv, lineVoltageV };
    if (cv.status !== 'ok') {
      const isOverload = cv.status === 'overload';
      findings.push({
        code: isOverload ? 'CV_OVERLOAD' : 'CV_TAPS_OVER_HEADROOM',
        severity: isOverload ? 'critical' : 'warning',
        message:
          `${channelName}: the speaker taps add up to ${fmt(cv.totalTapWatts, 1)} W on a ${fmt(cv.ratedWatts, 0)} W output (${fmt(cv.loadFraction * 100, 0)} %). ` +
          (isOverload
            ? 'That is more than the amplifier can deliver; lower some taps or split the line.'
            : `Common practice keeps taps at or below ${fmt(options.cvMaxLoadFraction * 100, 0)} % of the rating to leave headroom; lower a tap or two.`),
        path: ampPath,
        itemId: amplifier.id,
        channel,
        data: { totalTapWatts: cv.totalTapWatts, ratedWatts: cv.ratedWatts, loadFraction: cv.loadFraction },
      });
    }
  }
  return { circuit, result, withCable, ideal, voltageV };
}

function checkCvCompatibility(
  item: AsBuilt['items'][number],
  channelDef: AmplifierChannel,
  channelName: string,
  channel: ChannelRef,
  itemIndex: number,
  findings: Finding[],
): void {
  const isCvSpeaker = item.kind === 'speaker' && item.constantVoltage !== undefined;
  const path = ['items', itemIndex];
  if (channelDef.constantVoltage !== undefined && !isCvSpeaker) {
    findings.push({
      code: 'LOW_IMPEDANCE_SPEAKER_ON_CV_LINE',
      severity: 'critical',
      message: `"${item.label}" has no transformer tap but is on ${channelName}, a ${channelDef.constantVoltage.lineVoltage} line. A low-impedance speaker on a constant-voltage line will be overdriven and can short the amplifier.`,
      path,
      itemId: item.id,
      channel,
    });
  } else if (channelDef.constantVoltage === undefined && isCvSpeaker) {
    findings.push({
      code: 'CV_SPEAKER_ON_LOW_IMPEDANCE_CHANNEL',
      severity: 'warning',
      message: `"${item.label}" is set to a constant-voltage tap but ${channelName} is a low-impedance output: it will play very quietly. Set the speaker to its low-impedance (bypass) position or use a constant-voltage output.`,
      path,
      itemId: item.id,
      channel,
    });
  } else if (
    channelDef.constantVoltage !== undefined &&
    item.kind === 'speaker' &&
    item.constantVoltage !== undefined &&
    item.constantVoltage.lineVoltage !== channelDef.constantVoltage.lineVoltage
  ) {
    findings.push({
      code: 'CV_LINE_VOLTAGE_MISMATCH',
      severity: 'warning',
      message: `"${item.label}" is tapped for a ${item.constantVoltage.lineVoltage} line but ${channelName} is a ${channelDef.constantVoltage.lineVoltage} line; its actual power differs from the tap marking.`,
      path: [...path, 'constantVoltage', 'lineVoltage'],
      itemId: item.id,
      channel,
    });
  }
}
