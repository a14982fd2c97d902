import type { AsBuilt } from '../as-built/as-built.schema.js';
import type { ChannelRef } from '../as-built/common.schema.js';
import type { AmplifierChannel, AmplifierItem, Item } from '../as-built/item.schema.js';
import type { Finding } from '../analysis/finding.js';
import { CircuitTreeBuilder, parallelOhm, type CircuitTree } from './circuit.js';
import { cvLineVoltageV, cvTapImpedanceOhm } from './constant-voltage.js';

/**
 * Nominal impedance an item presents to one channel, ohms; Infinity for items without a load
 * (junction, wall entry, spare end, amplifier). Speakers: nominal impedance, or a CV tap's V²/P at the
 * speaker's own line voltage. Subwoofers: one coil (single, or dual with each coil on its own
 * channel), 2·Zcoil (dual, series), Zcoil/2 (dual, parallel). Unrounded.
 */
export function itemLoadOhm(item: Item): number {
  switch (item.kind) {
    case 'speaker':
      if (item.nominalImpedanceOhm !== undefined) return item.nominalImpedanceOhm;
      if (item.constantVoltage !== undefined) {
        return cvTapImpedanceOhm(cvLineVoltageV(item.constantVoltage.lineVoltage), item.constantVoltage.tapWatts);
      }
      return Infinity;
    case 'subwoofer':
      if (item.voiceCoils === 'single' || item.coilWiring === 'separate_channels') return item.coilImpedanceOhm;
      return item.coilWiring === 'series' ? 2 * item.coilImpedanceOhm : item.coilImpedanceOhm / 2;
    default:
      return Infinity;
  }
}

/** True for items that turn electrical power into sound. */
export function isLoadItem(item: Item): boolean {
  return item.kind === 'speaker' || item.kind === 'subwoofer';
}

/** One run's share of a tree edge: its loop resistance for this channel (pairs in parallel), ohms. */
export interface EdgeRun {
  runIndex: number;
  /** One conductor's resistance per metre at the analysis temperature. */
  ohmPerM: number;
  /** Number of the run's pairs carrying this channel (in parallel). */
  pairCount: number;
  loopOhm: number;
}

/** The wiring of one amplifier channel as a tree rooted at the amplifier output (node 0). */
export interface ChannelCircuit {
  channel: ChannelRef;
  amplifier: AmplifierItem;
  amplifierIndex: number;
  channelDef: AmplifierChannel;
  tree: CircuitTree;
  /** Item index (into asBuilt.items) of each node; node 0 is the amplifier. */
  nodeItemIndex: number[];
  /** Runs forming the edge into each node (several = runs in parallel between the same two items). */
  nodeEdgeRuns: EdgeRun[][];
  /** Tree node each run of this channel lands on. */
  runNode: Map<number, number>;
  /** True when the wiring has a loop; the tree is then incomplete and must not be solved. */
  hasLoop: boolean;
  findings: Finding[];
}

export function channelKey(ref: ChannelRef): string {
  return `${ref.amplifierItemId}\u0000${ref.channelId}`;
}

interface EdgeGroup {
  a: number;
  b: number;
  runs: EdgeRun[];
}

/**
 * Builds the circuit of every amplifier channel from the live runs (spare and abandoned runs carry
 * nothing). Runs are followed in either direction from the amplifier. Reports, as findings: loops in
 * the wiring, runs that carry the channel but do not connect back to its amplifier, and an amplifier
 * reached from another amplifier's channel. `runOhmPerM[r]` is one conductor's resistance per metre
 * of run r at the analysis temperature.
 */
export function buildChannelCircuits(
  asBuilt: AsBuilt,
  itemIndexById: ReadonlyMap<string, number>,
  runOhmPerM: readonly number[],
): ChannelCircuit[] {
  // channel key → run index → number of pairs of that run carrying the channel
  const runsByChannel = new Map<string, Map<number, number>>();
  asBuilt.runs.forEach((run, r) => {
    if (run.isSpare === true || run.isAbandoned === true) return;
    for (const pair of run.pairs) {
      if (pair.channel === null) continue;
      const key = channelKey(pair.channel);
      let runs = runsByChannel.get(key);
      if (runs === undefined) {
        runs = new Map();
        runsByChannel.set(key, runs);
      }
      runs.set(r, (runs.get(r) ?? 0) + 1);
    }
  });

  const circuits: ChannelCircuit[] = [];
  asBuilt.items.forEach((item, ampIndex) => {
    if (item.kind !== 'amplifier') return;
    for (const channelDef of item.channels) {
      const channel = { amplifierItemId: item.id, channelId: channelDef.id };
      circuits.push(
        buildOne(asBuilt, itemIndexById, runOhmPerM, item, ampIndex, channelDef, channel, runsByChannel.get(channelKey(channel))),
      );
    }
  });
  return circuits;
}

function buildOne(
  asBuilt: AsBuilt,
  itemIndexById: ReadonlyMap<string, number>,
  runOhmPerM: readonly number[],
  amplifier: AmplifierItem,
  amplifierIndex: number,
  channelDef: AmplifierChannel,
  channel: ChannelRef,
  runs: Map<number, number> | undefined,
): ChannelCircuit {
  const findings: Finding[] = [];
  const channelName = `${amplifier.label} / ${channelDef.name}`;

  // Group the channel's runs by the unordered pair of items they join: runs between the same two items
  // are electrically in parallel and form one edge.
  const groups: EdgeGroup[] = [];
  const groupByPair = new Map<string, number>();
  const adjacency = new Map<number, number[]>();
  for (const [r, pairCount] of runs ?? []) {
    const run = asBuilt.runs[r]!;
    const a = itemIndexById.get(run.fromItemId);
    const b = itemIndexById.get(run.toItemId);
    if (a === undefined || b === undefined) continue; // rejected by the schema
    const key = a < b ? `${a}:${b}` : `${b}:${a}`;
    const ohmPerM = runOhmPerM[r]!;
    const edgeRun: EdgeRun = {
      runIndex: r,
      ohmPerM,
      pairCount,
      loopOhm: (2 * run.measuredLengthM * ohmPerM) / pairCount,
    };
    const existing = groupByPair.get(key);
    if (existing !== undefined) {
      groups[existing]!.runs.push(edgeRun);
      continue;
    }
    groupByPair.set(key, groups.length);
    for (const end of [a, b]) {
      const list = adjacency.get(end);
      if (list === undefined) adjacency.set(end, [groups.length]);
      else list.push(groups.length);
    }
    groups.push({ a, b, runs: [edgeRun] });
  }

  const builder = new CircuitTreeBuilder();
  const nodeItemIndex = [amplifierIndex];
  const nodeEdgeRuns: EdgeRun[][] = [[]];
  const runNode = new Map<number, number>();
  const nodeOfItem = new Map<number, number>([[amplifierIndex, 0]]);
  const groupState = new Array<0 | 1 | 2>(groups.length).fill(0); // 0 unseen, 1 tree edge, 2 loop reported
  let hasLoop = false;

  const queue = [0];
  for (let head = 0; head < queue.length; head += 1) {
    const node = queue[head]!;
    const itemIdx = nodeItemIndex[node]!;
    for (const g of adjacency.get(itemIdx) ?? []) {
      const group = groups[g]!;
      // A tree edge (state 1) is the edge this node was reached by; a reported loop (state 2) is done.
      if (groupState[g] !== 0) continue;
      const otherItem = group.a === itemIdx ? group.b : group.a;
      if (nodeOfItem.has(otherItem)) {
        groupState[g] = 2;
        hasLoop = true;
        const first = group.runs[0]!;
        const run = asBuilt.runs[first.runIndex]!;
        findings.push({
          code: 'LOOP_IN_WIRING',
          severity: 'critical',
          message:
            `${channelName}: run "${run.label}" closes a loop — "${asBuilt.items[otherItem]!.label}" is already fed another way. ` +
            'A loop puts wiring in unexpected parallel paths; check which runs are really connected. Loads for this channel are not computed.',
          path: ['runs', first.runIndex],
          runId: run.id,
          channel,
        });
        continue;
      }
      groupState[g] = 1;
      const other = asBuilt.items[otherItem]!;
      const edgeOhm = parallelOhm(group.runs.map((er) => er.loopOhm));
      let load = itemLoadOhm(other);
      if (other.kind === 'amplifier') {
        load = Infinity;
        findings.push({
          code: 'AMPLIFIER_OUTPUTS_JOINED',
          severity: 'critical',
          message: `${channelName} is wired to another amplifier, "${other.label}". Amplifier outputs must never be joined; disconnect before powering up.`,
          path: ['runs', group.runs[0]!.runIndex],
          itemId: other.id,
          channel,
        });
      }
      const isSeries = (other.kind === 'speaker' || other.kind === 'subwoofer') && other.onwardWiring === 'series';
      const child = builder.add(node, edgeOhm, load, isSeries);
      nodeItemIndex.push(otherItem);
      nodeEdgeRuns.push(group.runs);
      for (const er of group.runs) runNode.set(er.runIndex, child);
      nodeOfItem.set(otherItem, child);
      // Do not walk through another amplifier: its outputs are a fault, not a path.
      if (other.kind !== 'amplifier') queue.push(child);
    }
  }

  groups.forEach((group, g) => {
    if (groupState[g] !== 0) return;
    for (const er of group.runs) {
      const run = asBuilt.runs[er.runIndex]!;
      findings.push({
        code: 'RUN_NOT_CONNECTED_TO_AMP',
        severity: 'critical',
        message:
          `Run "${run.label}" is recorded as carrying ${channelName}, but no chain of runs on that channel leads back to the amplifier. ` +
          'Either a run is missing from the record or the wiring is open somewhere.',
        path: ['runs', er.runIndex, 'pairs'],
        runId: run.id,
        channel,
      });
    }
  });

  return {
    channel,
    amplifier,
    amplifierIndex,
    channelDef,
    tree: builder.build(),
    nodeItemIndex,
    nodeEdgeRuns,
    runNode,
    hasLoop,
    findings,
  };
}
