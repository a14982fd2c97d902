import type { AsBuilt } from '../as-built/as-built.schema.js';
import type { ChannelRef, PlanPoint } from '../as-built/common.schema.js';
import type { Item } from '../as-built/item.schema.js';
import type { Gauge } from '../as-built/run.schema.js';
import { cableTotalsByType, type CableTotal } from '../cable/run-cable.js';
import { conductorResistanceOhmPerM, formatGauge, gaugeAreaMm2 } from '../cable/wire.js';
import { compareCommissioningChecks, type CheckResult } from '../checks/commissioning-compare.js';
import { checkRunDepth, SPARE_CIRCUIT, type RunCircuit, type RunDepthResult } from '../depth/depth-check.js';
import { buildFeatureCollection, type GeoJsonFeatureCollection, type GeoJsonItemInput, type GeoJsonRunInput } from '../geometry/geojson.js';
import { createLocalFrame } from '../geometry/local-tangent-plane.js';
import { compareRouteLength, polylineLengthM, type LengthComparison } from '../geometry/polyline.js';
import { solvePositionFromTies, type TieObservation } from '../geometry/ties.js';
import { analyzeChannel, type ChannelLoadResult, type SolvedChannel } from '../loads/channel-analysis.js';
import { buildChannelCircuits, isLoadItem } from '../loads/channel-circuits.js';
import { cvLineVoltageV } from '../loads/constant-voltage.js';
import { suggestRunGauges, type GaugeSuggestion } from '../loads/gauge-suggestion.js';
import { AnalysisOptionsSchema, type AnalysisOptions, type AnalysisOptionsInput } from './analysis-options.schema.js';
import { composeMessage, fmt, qty, sortFindings, type Finding } from './finding.js';

export interface RunResult {
  runId: string;
  label: string;
  cableType: string;
  gauge: Gauge;
  gaugeLabel: string;
  /** Conductor area, mm². */
  areaMm2: number;
  /** One conductor's resistance at the analysis temperature, Ω/m. */
  conductorOhmPerM: number;
  measuredLengthM: number;
  /** Loop resistance of one pair (2·L·r), ohms. */
  pairLoopOhm: number;
  /** Channels carried (one per pair; a channel on two pairs appears once). */
  channels: ChannelRef[];
  isSpare: boolean;
  isAbandoned: boolean;
  /** Plan length of the drawn route, metres (null without a route). */
  routeLengthM: number | null;
  lengthCheck: LengthComparison | null;
  gaugeSuggestion: GaugeSuggestion | null;
}

export interface PositionResult {
  itemId: string;
  x: number;
  y: number;
  source: 'ties' | 'manual' | 'gps';
  /** Estimated horizontal accuracy, metres; null when the record gives none. */
  accuracyM: number | null;
  method?: 'two_ties' | 'least_squares';
  residualRmsM?: number;
}

export interface AsBuiltAnalysis {
  /** The inputs the figures rest on, echoed so a printed packet states them. */
  assumptions: {
    conductorTemperatureC: number;
    lossLimitDb: number;
    shortThresholdOhm: number;
    cvMaxLoadFraction: number;
    tapeToleranceM: number;
    routeLengthTolerance: { absoluteM: number; relative: number };
    depthRuleTable: string;
    notes: string[];
  };
  summary: { critical: number; warning: number; info: number; itemCount: number; runCount: number; totalCableM: number };
  runs: RunResult[];
  cableTotals: CableTotal[];
  channels: ChannelLoadResult[];
  depth: RunDepthResult[];
  positions: PositionResult[];
  checks: CheckResult[];
  /** RFC 7946 FeatureCollection of runs and items; null without a site origin. */
  geojson: GeoJsonFeatureCollection | null;
  findings: Finding[];
}

const NOTES = [
  'Conductor resistance: AWG from the ASTM B258 diameter and IACS copper (1/58 Ω·mm²/m at 20 °C, α = 0.00393/°C), solid-wire values (stranded cable is about 2 % higher); mm² from the IEC 60228 class 5 maximum.',
  'Loads are nominal impedances driven by an ideal amplifier at its rated output: V = √(P·Z) from the 8 Ω rating for loads of 8 Ω or more, else the 4 Ω rating; constant-voltage outputs at the line voltage.',
  'Level drop at the speaker: the level each speaker gets through the recorded cable against zero-resistance cable at the same amplifier voltage, in dB (and as the share of power it loses against that ideal cable). Power dissipated in the cable: the share of the amplifier\'s output turned to heat in a channel\'s cable, the figure the trade\'s tables quote. The two differ: 1.03 dB of level drop is 21 % less power at the speaker, while the cable dissipates 11 % of the output.',
  'Depth rules: the NEC sets no minimum cover for Class 2/3 speaker cable. As common practice, lines up to 30 V are checked against NEC Table 300.5 column 5, and 70 V / 100 V lines (or outputs above 30 V) against the more conservative cover Class 1 wiring would need (columns 1 and 3). Always defer to the authority having jurisdiction — these checks are not code approval.',
];

/**
 * The highest voltage a run's pairs carry: a constant-voltage channel's line voltage, or the largest rated
 * output voltage √(P·Z) of a low-impedance channel (8 Ω rating, and the 4 Ω rating when there is one).
 * Over 30 V is outside NEC Table 300.5 column 5. A run with no channel (a spare) carries nothing.
 */
function runCircuit(asBuilt: AsBuilt, run: AsBuilt['runs'][number], itemIndexById: ReadonlyMap<string, number>): RunCircuit {
  let best: RunCircuit | null = null;
  for (const pair of run.pairs) {
    if (pair.channel === null) continue;
    const index = itemIndexById.get(pair.channel.amplifierItemId);
    const amplifier = index === undefined ? undefined : asBuilt.items[index];
    if (amplifier?.kind !== 'amplifier') continue;
    const channelDef = amplifier.channels.find((c) => c.id === pair.channel!.channelId);
    if (channelDef === undefined) continue;
    let candidate: RunCircuit;
    if (channelDef.constantVoltage !== undefined) {
      const voltageV = cvLineVoltageV(channelDef.constantVoltage.lineVoltage);
      candidate = { circuit: 'up_to_30v', voltageV, description: `a ${channelDef.constantVoltage.lineVoltage} constant-voltage line` };
    } else {
      const voltageV = Math.max(
        Math.sqrt(amplifier.ratedWatts8Ohm * 8),
        amplifier.ratedWatts4Ohm === undefined ? 0 : Math.sqrt(amplifier.ratedWatts4Ohm * 4),
      );
      candidate = { circuit: 'up_to_30v', voltageV, description: `up to ${fmt(voltageV, 1)} V from a low-impedance amplifier output` };
    }
    candidate.circuit = candidate.voltageV! > 30 + 1e-9 ? 'over_30v' : 'up_to_30v';
    if (best === null || candidate.voltageV! > best.voltageV!) best = candidate;
  }
  return best ?? SPARE_CIRCUIT;
}

function buildItemPosition(
  item: Item,
  itemIndex: number,
  refs: ReadonlyMap<string, { x: number; y: number }>,
  options: AnalysisOptions,
  findings: Finding[],
): PositionResult | null {
  const ties = item.ties ?? [];
  if (ties.length >= 2) {
    const observations: TieObservation[] = [];
    for (const tie of ties) {
      const ref = refs.get(tie.referencePointId);
      if (ref !== undefined) observations.push({ x: ref.x, y: ref.y, distanceM: tie.distanceM });
    }
    const solution = solvePositionFromTies(observations, { tapeToleranceM: options.tapeToleranceM, sideHint: item.sideHint });
    if (solution.ok) {
      if (solution.isWeak) {
        findings.push({
          code: 'POSITION_WEAK_GEOMETRY',
          severity: 'warning',
          ...composeMessage`The ties to "${item.label}" meet at a shallow angle, so its position is only good to about ${qty.length(solution.accuracyM)}. Add a tie from a reference point off to one side.`,
          path: ['items', itemIndex, 'ties'],
          itemId: item.id,
          data: { accuracyM: Number.isFinite(solution.accuracyM) ? solution.accuracyM : null },
        });
      }
      if (solution.method === 'least_squares' && solution.residualRmsM > 3 * options.tapeToleranceM) {
        findings.push({
          code: 'POSITION_TIES_DISAGREE',
          severity: 'warning',
          ...composeMessage`The ties to "${item.label}" disagree by about ${qty.length(solution.residualRmsM)} (RMS); one is probably misread or taped from the wrong point. Re-tape before backfill if you can.`,
          path: ['items', itemIndex, 'ties'],
          itemId: item.id,
          data: { residualRmsM: solution.residualRmsM },
        });
      }
      return {
        itemId: item.id,
        x: solution.x,
        y: solution.y,
        source: 'ties',
        accuracyM: Number.isFinite(solution.accuracyM) ? solution.accuracyM : null,
        method: solution.method,
        residualRmsM: solution.residualRmsM,
      };
    }
    findings.push({
      code: solution.reason === 'side_hint_missing' ? 'POSITION_SIDE_HINT_MISSING' : 'POSITION_FROM_TIES_FAILED',
      severity: 'warning',
      message: `"${item.label}" could not be placed from its ties: ${solution.message}.${item.position !== undefined ? ' The recorded position is used instead.' : ''}`,
      path: solution.reason === 'side_hint_missing' ? ['items', itemIndex, 'sideHint'] : ['items', itemIndex, 'ties'],
      itemId: item.id,
    });
  }
  if (item.position !== undefined) {
    return {
      itemId: item.id,
      x: item.position.x,
      y: item.position.y,
      source: item.position.source,
      accuracyM: item.position.accuracyM ?? null,
    };
  }
  if (item.kind !== 'amplifier') {
    findings.push({
      code: 'POSITION_UNKNOWN',
      severity: ties.length === 1 ? 'warning' : 'info',
      message:
        ties.length === 1
          ? `"${item.label}" has one tie; a second tie from another reference point is needed to place it.`
          : `"${item.label}" has no position: tape two ties to reference points or place it on the plan.`,
      path: ['items', itemIndex, 'ties'],
      itemId: item.id,
    });
  }
  return null;
}

/**
 * Full engineering analysis of a validated as-built (parse it with `AsBuiltSchema` first): per-run cable
 * figures and gauge suggestions, cable totals by type, per-channel loads and losses, depth checks,
 * item positions from ties, commissioning comparisons, an RFC 7946 FeatureCollection and every finding,
 * most severe first. Pure and deterministic; all values SI and unrounded (round for display).
 */
export function analyzeAsBuilt(asBuilt: AsBuilt, optionsInput: AnalysisOptionsInput = {}): AsBuiltAnalysis {
  const options = AnalysisOptionsSchema.parse(optionsInput);
  const findings: Finding[] = [];
  const itemIndexById = new Map<string, number>();
  asBuilt.items.forEach((item, i) => itemIndexById.set(item.id, i));

  // Cable
  const runOhmPerM = asBuilt.runs.map((run, i) => conductorResistanceOhmPerM(run.gauge, options.conductorTemperatureC, `runs.${i}.gauge`));

  // Loads
  const circuits = buildChannelCircuits(asBuilt, itemIndexById, runOhmPerM);
  const solved: SolvedChannel[] = circuits.map((circuit) =>
    analyzeChannel(
      asBuilt,
      circuit,
      { lossLimitDb: options.lossLimitDb, shortThresholdOhm: options.shortThresholdOhm, cvMaxLoadFraction: options.cvMaxLoadFraction },
      findings,
    ),
  );
  checkLoadItemsReached(asBuilt, solved, findings);
  const suggestions = suggestRunGauges(asBuilt, solved, options.conductorTemperatureC, options.lossLimitDb, findings);

  // Depth, by the circuit each run carries
  const depth = asBuilt.runs.map((run, r) => checkRunDepth(run, r, options.depthRules, findings, runCircuit(asBuilt, run, itemIndexById)));

  // Positions
  const refs = new Map(asBuilt.referencePoints.map((p) => [p.id, { x: p.x, y: p.y }]));
  const positions: PositionResult[] = [];
  const positionById = new Map<string, PlanPoint>();
  asBuilt.items.forEach((item, i) => {
    const pos = buildItemPosition(item, i, refs, options, findings);
    if (pos !== null) {
      positions.push(pos);
      positionById.set(item.id, { x: pos.x, y: pos.y });
    }
  });

  // Runs
  const runs: RunResult[] = asBuilt.runs.map((run, r) => {
    const ohmPerM = runOhmPerM[r]!;
    const seen = new Set<string>();
    const channels: ChannelRef[] = [];
    for (const pair of run.pairs) {
      if (pair.channel === null) continue;
      const key = `${pair.channel.amplifierItemId}\u0000${pair.channel.channelId}`;
      if (!seen.has(key)) {
        seen.add(key);
        channels.push(pair.channel);
      }
    }
    let routeLengthM: number | null = null;
    let lengthCheck: LengthComparison | null = null;
    if (run.route !== undefined) {
      routeLengthM = polylineLengthM(run.route);
      lengthCheck = compareRouteLength(routeLengthM, run.measuredLengthM, options.routeLengthTolerance);
      if (lengthCheck.isMismatch) {
        findings.push({
          code: 'ROUTE_LENGTH_MISMATCH',
          severity: 'warning',
          ...composeMessage`Run "${run.label}" is recorded as ${qty.length(run.measuredLengthM)} of cable but its drawn route is ${qty.length(routeLengthM)} (allowed difference ${qty.length(lengthCheck.allowedM)}). Check the route on the plan or the measured length.`,
          path: ['runs', r, 'measuredLengthM'],
          runId: run.id,
          data: { routeLengthM, measuredLengthM: run.measuredLengthM, differenceM: lengthCheck.differenceM },
        });
      }
    }
    return {
      runId: run.id,
      label: run.label,
      cableType: run.cableType,
      gauge: run.gauge,
      gaugeLabel: formatGauge(run.gauge),
      areaMm2: gaugeAreaMm2(run.gauge),
      conductorOhmPerM: ohmPerM,
      measuredLengthM: run.measuredLengthM,
      pairLoopOhm: 2 * run.measuredLengthM * ohmPerM,
      channels,
      isSpare: run.isSpare === true,
      isAbandoned: run.isAbandoned === true,
      routeLengthM,
      lengthCheck,
      gaugeSuggestion: suggestions.get(r) ?? null,
    };
  });

  // Checks
  const checks = compareCommissioningChecks(asBuilt, solved, options.checkTolerances, findings);

  // GeoJSON
  let geojson: GeoJsonFeatureCollection | null = null;
  const origin = asBuilt.site?.origin;
  if (options.includeGeoJson && origin !== undefined) {
    const frame = createLocalFrame(origin, asBuilt.site?.northAzimuthDeg ?? 0);
    const runInputs: GeoJsonRunInput[] = asBuilt.runs.map((run, r) => {
      const from = positionById.get(run.fromItemId);
      const to = positionById.get(run.toItemId);
      const route = run.route ?? (from !== undefined && to !== undefined ? [from, to] : null);
      const d = depth[r]!;
      return {
        id: run.id,
        route,
        properties: {
          featureKind: 'run',
          label: run.label,
          cableType: run.cableType,
          gauge: formatGauge(run.gauge),
          conductors: run.conductors,
          method: run.method,
          location: run.location ?? 'general',
          measuredLengthM: run.measuredLengthM,
          minDepthM: d.minDepthM,
          maxDepthM: d.maxDepthM,
          isSpare: run.isSpare === true,
          isAbandoned: run.isAbandoned === true,
          isRouteDrawn: run.route !== undefined,
        },
      };
    });
    const posById = new Map(positions.map((p) => [p.itemId, p]));
    const itemInputs: GeoJsonItemInput[] = asBuilt.items.map((item) => {
      const pos = posById.get(item.id);
      return {
        id: item.id,
        position: pos === undefined ? null : { x: pos.x, y: pos.y },
        properties: {
          featureKind: 'item',
          kind: item.kind,
          label: item.label,
          model: item.model ?? null,
          zoneId: item.zoneId ?? null,
          positionSource: pos?.source ?? null,
          accuracyM: pos?.accuracyM ?? null,
        },
      };
    });
    geojson = buildFeatureCollection(frame, runInputs, itemInputs);
  }

  sortFindings(findings);
  const count = (s: Finding['severity']): number => findings.filter((f) => f.severity === s).length;
  return {
    assumptions: {
      conductorTemperatureC: options.conductorTemperatureC,
      lossLimitDb: options.lossLimitDb,
      shortThresholdOhm: options.shortThresholdOhm,
      cvMaxLoadFraction: options.cvMaxLoadFraction,
      tapeToleranceM: options.tapeToleranceM,
      routeLengthTolerance: options.routeLengthTolerance,
      depthRuleTable: options.depthRules.name,
      notes: NOTES,
    },
    summary: {
      critical: count('critical'),
      warning: count('warning'),
      info: count('info'),
      itemCount: asBuilt.items.length,
      runCount: asBuilt.runs.length,
      totalCableM: asBuilt.runs.reduce((s, r) => s + r.measuredLengthM, 0),
    },
    runs,
    cableTotals: cableTotalsByType(asBuilt.runs),
    channels: solved.map((s) => s.result),
    depth,
    positions,
    checks,
    geojson,
    findings,
  };
}

/**
 * Speakers and subwoofers must be on exactly one channel (a dual-voice-coil sub with coils on separate
 * channels may be on two). Reports speakers on no channel — distinguishing those whose only connection
 * is a spare or abandoned run (an open circuit) — and items joined to two channels.
 */
function checkLoadItemsReached(asBuilt: AsBuilt, solved: readonly SolvedChannel[], findings: Finding[]): void {
  const channelsByItem = new Map<number, ChannelRef[]>();
  for (const sc of solved) {
    sc.circuit.nodeItemIndex.forEach((itemIdx, node) => {
      if (node === 0) return;
      const list = channelsByItem.get(itemIdx);
      if (list === undefined) channelsByItem.set(itemIdx, [sc.circuit.channel]);
      else list.push(sc.circuit.channel);
    });
  }
  const deadRunsByItem = new Map<string, string[]>();
  for (const run of asBuilt.runs) {
    const isDead = run.isSpare === true || run.isAbandoned === true || run.pairs.every((p) => p.channel === null);
    if (!isDead) continue;
    for (const end of [run.fromItemId, run.toItemId]) {
      const list = deadRunsByItem.get(end);
      if (list === undefined) deadRunsByItem.set(end, [run.label]);
      else list.push(run.label);
    }
  }
  asBuilt.items.forEach((item, i) => {
    if (!isLoadItem(item)) return;
    const channels = channelsByItem.get(i) ?? [];
    if (channels.length === 0) {
      const dead = deadRunsByItem.get(item.id);
      findings.push(
        dead !== undefined
          ? {
              code: 'SPEAKER_ONLY_ON_SPARE_RUN',
              severity: 'warning',
              message: `"${item.label}" is connected only through ${dead.map((l) => `"${l}"`).join(', ')}, which is spare, abandoned or has no channel on its pairs: the speaker is on an open circuit and will not play.`,
              path: ['items', i],
              itemId: item.id,
            }
          : {
              code: 'SPEAKER_ON_NO_CHANNEL',
              severity: 'warning',
              message: `"${item.label}" is not on any amplifier channel. Record the run that feeds it and which pair carries which channel.`,
              path: ['items', i],
              itemId: item.id,
            },
      );
      return;
    }
    const allowed = item.kind === 'subwoofer' && item.coilWiring === 'separate_channels' ? 2 : 1;
    if (channels.length > allowed) {
      findings.push({
        code: 'ITEM_ON_TWO_CHANNELS',
        severity: 'critical',
        message:
          `"${item.label}" is wired to ${channels.length} channels (${channels.map((c) => c.channelId).join(', ')}). ` +
          'Two amplifier outputs joined through one speaker fight each other and can damage the amplifier.',
        path: ['items', i],
        itemId: item.id,
      });
    }
  });
}
