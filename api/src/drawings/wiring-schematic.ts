import type { Container } from '@svgdotjs/svg.js';
import ELKImport from 'elkjs/lib/elk.bundled.js';
import type { ElkExtendedEdge, ElkNode } from 'elkjs/lib/elk.bundled.js';

import type { AsBuiltAnalysis } from '../domain/analysis/analyze.js';
import { FINDING_SEVERITY_LABELS, type Finding, findingText, type FindingSeverity } from '../domain/analysis/finding.js';
import type { AsBuilt } from '../domain/as-built/as-built.schema.js';
import type { Item } from '../domain/as-built/item.schema.js';
import type { DrawingBaseOptions } from './drawing-options.js';
import { trimNumber } from '../domain/format/length.js';
import { printableArea, type Orientation, type PaperSize, type SheetMargins } from './paper.js';
import { PAPER, RUN_ORANGE, WARNING_INK } from './marking-palette.js';
import { addText, pointsAttr, r2 } from './svg-canvas.js';
import { BASELINE_EM, type FontFace, LINE_HEIGHT_EM, textWidth, wrapText } from './text-box.js';

/** The one method of elkjs the schematic uses. */
type ElkLayoutEngine = new () => { layout(graph: ElkNode): Promise<ElkNode> };
// The CommonJS module is the ELK class and also carries it as `default`. A default import is typed as
// the namespace under the API's `module: nodenext` (VERSIONS.md) and as the class under the web app's
// bundler resolution, so take the class whichever way this file is compiled.
const ELK = ((ELKImport as unknown as { default?: ElkLayoutEngine }).default ?? ELKImport) as unknown as ElkLayoutEngine;

export interface WiringSchematicOptions extends DrawingBaseOptions {
  paper?: PaperSize;
  /** `auto`: portrait or landscape, whichever prints the graph (and its text) larger. */
  orientation?: Orientation | 'auto';
  /** Space the page keeps above the drawing (a heading), pt: the graph shrinks to leave it. */
  headroomPt?: number;
  /** The page's margins, when not the default 0.5 in / 12.7 mm (the packet's own pages). */
  margins?: SheetMargins;
  /**
   * Numbered finding badges and their list (default true). The packet leaves them out: its homeowner
   * pages carry no engineering findings, which are in the Engineering notes appendix.
   */
  showFindings?: boolean;
  /** Layer direction; 'auto' lays out both and keeps the one that needs less shrinking to fit the width. */
  direction?: 'RIGHT' | 'DOWN' | 'auto';
}

/** Every text of the schematic prints at 8 pt or larger once scaled to the page (`data-min-text-pt`). */
export const SCHEMATIC_MIN_TEXT_PT = 8;
const NODE_FONT = 8.5;
const NODE_DETAIL_FONT = 8;
const EDGE_FONT = 8;
const BADGE_FONT = 8;
const LIST_FONT = 8;
const POLARITY_FONT = 8;
const NODE_PAD = 4;
const BADGE = 12;
/** Lines in boxes and edge labels are wrapped to keep the layout narrow enough for a page. */
/** Widest line of text in a box, pt: narrow boxes keep a wide tree of speakers on the page at 8 pt. */
const NODE_TEXT_WIDTH_PT = 76;
const EDGE_MAX_CHARS = 16;
const AUTO_DIRECTION_MAX_NODES = 150;

interface SchematicNode {
  id: string;
  /** How many of `lines` are the (bold) name. */
  boldCount: number;
  /** Item id, or `<amplifierItemId>/<channelId>` for a channel. */
  forId: string;
  kind: 'channel' | Item['kind'];
  lines: string[];
  width: number;
  height: number;
}

interface SchematicEdge {
  id: string;
  boldCount: number;
  runId: string;
  source: string;
  target: string;
  lines: string[];
  isDead: boolean;
}

interface Badge {
  number: number;
  severity: FindingSeverity;
}

function ohms(value: number | null): string {
  return value === null ? 'open' : `${trimNumber(value, 2)} Ω`;
}

function itemFacts(item: Item, lossDb: number | undefined): string[] {
  const loss = lossDb === undefined ? [] : [`level drop ${trimNumber(lossDb, 2)} dB`];
  switch (item.kind) {
    case 'speaker':
      return [
        item.constantVoltage !== undefined
          ? `tap ${trimNumber(item.constantVoltage.tapWatts, 1)} W on ${item.constantVoltage.lineVoltage} line`
          : `${trimNumber(item.nominalImpedanceOhm ?? 0, 2)} Ω speaker`,
        ...loss,
      ];
    case 'subwoofer': {
      const coils =
        item.voiceCoils === 'single'
          ? `single coil ${trimNumber(item.coilImpedanceOhm, 2)} Ω`
          : `dual coil 2 × ${trimNumber(item.coilImpedanceOhm, 2)} Ω, ${item.coilWiring === 'separate_channels' ? 'separate channels' : `${item.coilWiring} = ${trimNumber(item.coilWiring === 'series' ? item.coilImpedanceOhm * 2 : item.coilImpedanceOhm / 2, 2)} Ω`}`;
      return [coils, ...loss];
    }
    // A square box is a splice or wall entry (its name says which): no second line, so the tree stays short.
    case 'junction':
    case 'wall_entry':
      return [];
    case 'spare_end':
      return [item.isCapped ? 'spare end, capped' : 'spare end, NOT capped'];
    case 'amplifier':
      return ['amplifier'];
  }
}

/** Wraps each line of an edge label to `maxChars`, keeping the first (bold) line's pieces first. */
function wrapLines(lines: readonly string[], maxChars: number): { lines: string[]; boldCount: number } {
  const head = wrapText(lines[0] ?? '', maxChars);
  return { lines: [...head, ...lines.slice(1).flatMap((l) => wrapText(l, maxChars))], boldCount: head.length };
}

/** Wraps a box's lines to {@link NODE_TEXT_WIDTH_PT} in the shipped font: the (bold) name first, then the facts. */
function wrapNodeLines(lines: readonly string[]): { lines: string[]; boldCount: number } {
  const head = wrapToWidth(lines[0] ?? '', NODE_TEXT_WIDTH_PT, NODE_FONT, 'bold');
  return { lines: [...head, ...lines.slice(1).flatMap((l) => wrapToWidth(l, NODE_TEXT_WIDTH_PT, NODE_DETAIL_FONT))], boldCount: head.length };
}

/** `badgeRoom`: room at the right of the box for finding badges (none when findings are not shown). */
function nodeSize(lines: string[], boldCount: number, badgeRoom: number): { width: number; height: number } {
  const widest = Math.max(...lines.map((l, i) => (i < boldCount ? textWidth(l, NODE_FONT, 'bold') : textWidth(l, NODE_DETAIL_FONT))));
  return { width: Math.ceil(widest + 2 * NODE_PAD + badgeRoom), height: Math.ceil(lines.length * NODE_FONT * LINE_HEIGHT_EM + 2 * NODE_PAD) };
}

/** Builds the schematic graph: channel nodes, item nodes and one edge per run (per channel out of the amplifier). */
function buildGraph(asBuilt: AsBuilt, analysis: AsBuiltAnalysis, badgeRoom: number): { nodes: SchematicNode[]; edges: SchematicEdge[] } {
  const itemById = new Map(asBuilt.items.map((i) => [i.id, i]));
  const runResultById = new Map(analysis.runs.map((r) => [r.runId, r]));
  const lossByItem = new Map<string, number>();
  for (const ch of analysis.channels) for (const load of ch.loads) if (!lossByItem.has(load.itemId)) lossByItem.set(load.itemId, load.cableLossDb);
  const nodes: SchematicNode[] = [];
  const nodeIds = new Set<string>();
  const channelNodeId = (ampId: string, channelId: string): string => `ch:${ampId}/${channelId}`;

  for (const amp of asBuilt.items) {
    if (amp.kind !== 'amplifier') continue;
    for (const channel of amp.channels) {
      const result = analysis.channels.find((c) => c.channel.amplifierItemId === amp.id && c.channel.channelId === channel.id);
      const lines = [`${amp.label} — ${channel.name}`];
      if (result === undefined || !result.isSolved) lines.push('load not computed');
      else if (result.mode === 'constant_voltage' && result.cv !== undefined) {
        lines.push(`${trimNumber(result.cv.lineVoltageV, 1)} V line, taps ${trimNumber(result.cv.totalTapWatts, 1)} W`, `amp rated ${trimNumber(result.cv.ratedWatts, 1)} W`);
      } else {
        lines.push(`load ${ohms(result.loadOhmNominal)}`, `${ohms(result.loadOhmWithCable)} with cable`, `amp minimum ${ohms(result.minimumImpedanceOhm)}`);
      }
      const id = channelNodeId(amp.id, channel.id);
      const wrapped = wrapNodeLines(lines);
      nodes.push({ id, forId: `${amp.id}/${channel.id}`, kind: 'channel', ...wrapped, ...nodeSize(wrapped.lines, wrapped.boldCount, badgeRoom) });
      nodeIds.add(id);
    }
  }
  const addItemNode = (itemId: string): void => {
    const id = `item:${itemId}`;
    const item = itemById.get(itemId);
    if (nodeIds.has(id) || item === undefined || item.kind === 'amplifier') return;
    const wrapped = wrapNodeLines([item.label, ...itemFacts(item, lossByItem.get(item.id))]);
    nodes.push({ id, forId: item.id, kind: item.kind, ...wrapped, ...nodeSize(wrapped.lines, wrapped.boldCount, badgeRoom) });
    nodeIds.add(id);
  };

  const edges: SchematicEdge[] = [];
  for (const run of asBuilt.runs) {
    const from = itemById.get(run.fromItemId);
    const to = itemById.get(run.toItemId);
    if (from === undefined || to === undefined) continue;
    const result = runResultById.get(run.id);
    const isDead = run.isSpare === true || run.isAbandoned === true || run.pairs.every((p) => p.channel === null);
    const tag = run.isAbandoned === true ? 'ABANDONED · ' : run.isSpare === true ? 'SPARE · ' : isDead ? 'no channel · ' : '';
    const gauge = result?.gaugeLabel ?? run.cableType;
    const channelRefs = result?.channels ?? [];
    // A run leaving the amplifier is drawn once per channel it carries, from that channel's node.
    const ampEnd = from.kind === 'amplifier' ? from : to.kind === 'amplifier' ? to : null;
    const otherEnd = ampEnd === from ? to : from;
    if (ampEnd !== null && !isDead && channelRefs.length > 0) {
      addItemNode(otherEnd.id);
      for (const ref of channelRefs) {
        const source = channelNodeId(ref.amplifierItemId, ref.channelId);
        if (!nodeIds.has(source)) continue;
        const pair = run.pairs.filter((p) => p.channel?.channelId === ref.channelId && p.channel.amplifierItemId === ref.amplifierItemId).map((p) => p.pairIndex);
        edges.push({
          id: `edge:${run.id}:${ref.channelId}`,
          runId: run.id,
          source,
          target: `item:${otherEnd.id}`,
          ...wrapLines([run.label, `${gauge} · pair ${pair.join('+')}`], EDGE_MAX_CHARS),
          isDead,
        });
      }
      continue;
    }
    if (from.kind === 'amplifier' || to.kind === 'amplifier') continue;
    addItemNode(from.id);
    addItemNode(to.id);
    // Channels by their names: ids are database uuids in a recorded job, meaningless on a drawing.
    const names = channelRefs.length > 1 ? ` · ${channelRefs.map((c) => channelName(asBuilt, c.amplifierItemId, c.channelId)).join(' + ')}` : '';
    edges.push({ id: `edge:${run.id}`, runId: run.id, source: `item:${from.id}`, target: `item:${to.id}`, ...wrapLines([run.label, `${tag}${gauge}${names}`], EDGE_MAX_CHARS), isDead });
  }
  // Speakers and subwoofers on no run at all still appear, unconnected.
  for (const item of asBuilt.items) if (item.kind === 'speaker' || item.kind === 'subwoofer') addItemNode(item.id);
  return { nodes, edges };
}

/** A channel's recorded name (its id only when the amplifier or channel is missing from the record). */
function channelName(asBuilt: AsBuilt, amplifierItemId: string, channelId: string): string {
  const amp = asBuilt.items.find((item) => item.id === amplifierItemId);
  const channel = amp?.kind === 'amplifier' ? amp.channels.find((c) => c.id === channelId) : undefined;
  return channel?.name ?? channelId;
}

/** Ids of nodes joined (ignoring direction) to at least one channel node. */
function connectedToChannels(nodes: readonly SchematicNode[], edges: readonly SchematicEdge[]): Set<string> {
  const neighbours = new Map<string, string[]>();
  for (const e of edges) {
    neighbours.set(e.source, [...(neighbours.get(e.source) ?? []), e.target]);
    neighbours.set(e.target, [...(neighbours.get(e.target) ?? []), e.source]);
  }
  const seen = new Set<string>(nodes.filter((n) => n.kind === 'channel').map((n) => n.id));
  const queue = [...seen];
  while (queue.length > 0) {
    const id = queue.pop()!;
    for (const next of neighbours.get(id) ?? []) {
      if (!seen.has(next)) {
        seen.add(next);
        queue.push(next);
      }
    }
  }
  return seen;
}

/** Which node or edge a finding points at: its item, run or channel, else the first step of its path. */
function findingTarget(f: Finding, asBuilt: AsBuilt): string | null {
  // A channel finding names the amplifier item too; the amplifier is drawn as its channels.
  if (f.channel !== undefined) return `ch:${f.channel.amplifierItemId}/${f.channel.channelId}`;
  const amp = asBuilt.items.find((i) => i.id === f.itemId && i.kind === 'amplifier');
  if (amp !== undefined && amp.kind === 'amplifier' && amp.channels[0] !== undefined) return `ch:${amp.id}/${amp.channels[0].id}`;
  if (f.itemId !== undefined) return `item:${f.itemId}`;
  if (f.runId !== undefined) return `run:${f.runId}`;
  const [collection, index] = f.path;
  if (collection === 'items' && typeof index === 'number' && asBuilt.items[index] !== undefined) return `item:${asBuilt.items[index].id}`;
  if (collection === 'runs' && typeof index === 'number' && asBuilt.runs[index] !== undefined) return `run:${asBuilt.runs[index].id}`;
  return null;
}

async function layout(nodes: SchematicNode[], edges: SchematicEdge[], direction: 'RIGHT' | 'DOWN'): Promise<ElkNode> {
  const elk = new ELK();
  const graph: ElkNode = {
    id: 'root',
    layoutOptions: {
      'elk.algorithm': 'layered',
      'elk.direction': direction,
      'elk.edgeRouting': 'ORTHOGONAL',
      'elk.spacing.nodeNode': '6',
      'elk.layered.spacing.nodeNodeBetweenLayers': '8',
      'elk.spacing.edgeLabel': '2',
      'elk.spacing.edgeNode': '5',
      'elk.layered.spacing.edgeNodeBetweenLayers': '3',
      'elk.edgeLabels.placement': 'CENTER',
      'elk.layered.considerModelOrder.strategy': 'NODES_AND_EDGES',
      'elk.layered.nodePlacement.strategy': 'BRANDES_KOEPF',
      'elk.layered.nodePlacement.bk.fixedAlignment': 'BALANCED',
      'elk.padding': '[top=4,left=4,bottom=4,right=4]',
    },
    children: nodes.map((n) => ({ id: n.id, width: n.width, height: n.height })),
    edges: edges.map(
      (e): ElkExtendedEdge => ({
        id: e.id,
        sources: [e.source],
        targets: [e.target],
        labels: [
          {
            text: e.lines.join('\n'),
            width: Math.ceil(Math.max(...e.lines.map((l, i) => textWidth(l, EDGE_FONT, i < e.boldCount ? 'bold' : 'regular'))) + 2),
            height: Math.ceil(e.lines.length * EDGE_FONT * LINE_HEIGHT_EM + 2),
          },
        ],
      }),
    ),
  };
  return elk.layout(graph);
}

/**
 * `+` and `−` beside the end of a pair's line where it is connected, the `+` on the left of the direction
 * of travel (channel → speaker): the conductor on the channel's + terminal lands on the speaker's +.
 */
function drawPolarity(parent: Container, pts: readonly { x: number; y: number }[]): void {
  const marks = parent.group().attr('data-role', 'polarity');
  // At the end the pair arrives (the speaker, splice or wall entry): where someone connects it.
  const ends: [{ x: number; y: number }, { x: number; y: number }, number][] = [[pts[pts.length - 1]!, pts[pts.length - 2]!, -1]];
  for (const [at, next, sense] of ends) {
    const len = Math.hypot(next.x - at.x, next.y - at.y) || 1;
    // Unit vector along the line in the direction of travel (channel → speaker) and its left normal.
    const ux = ((next.x - at.x) / len) * sense;
    const uy = ((next.y - at.y) / len) * sense;
    const along = Math.min(10, len / 2) * sense;
    const base = { x: at.x + ux * along, y: at.y + uy * along };
    const left = { x: uy, y: -ux };
    const off = 5;
    addText(marks, '+', base.x + left.x * off, base.y + left.y * off + POLARITY_FONT * 0.35, { size: POLARITY_FONT, anchor: 'middle', weight: 'bold' });
    addText(marks, '−', base.x - left.x * off, base.y - left.y * off + POLARITY_FONT * 0.35, { size: POLARITY_FONT, anchor: 'middle', weight: 'bold' });
  }
}

/** Splits text into lines no wider than `maxWidth` pt in the shipped font at `size` pt (a longer word gets its own line). */
function wrapToWidth(text: string, maxWidth: number, size: number, face: FontFace = 'regular'): string[] {
  const lines: string[] = [];
  let line = '';
  for (const word of text.split(/\s+/).filter((w) => w.length > 0)) {
    const candidate = line.length === 0 ? word : `${line} ${word}`;
    if (line.length > 0 && textWidth(candidate, size, face) > maxWidth) {
      lines.push(line);
      line = word;
    } else line = candidate;
  }
  if (line.length > 0) lines.push(line);
  return lines;
}

function drawBadge(parent: Container, badge: Badge, x: number, y: number): void {
  const g = parent.group().attr({ 'data-finding': badge.number, 'data-severity': badge.severity });
  const c = { x: x + BADGE / 2, y: y + BADGE / 2 };
  const h = BADGE / 2;
  if (badge.severity === 'critical') {
    // Octagon, filled black: "stop" (shape, not a marking colour).
    const pts = Array.from({ length: 8 }, (_, i) => {
      const a = ((i * 45 + 22.5) * Math.PI) / 180;
      return { x: c.x + Math.cos(a) * h * 1.08, y: c.y + Math.sin(a) * h * 1.08 };
    });
    g.polygon(pointsAttr(pts)).fill(WARNING_INK).stroke({ color: WARNING_INK, width: 0.5 });
    addText(g, String(badge.number), c.x, c.y + 2.9, { size: BADGE_FONT, anchor: 'middle', weight: 'bold', fill: '#ffffff' });
  } else if (badge.severity === 'warning') {
    // Triangle, white with a heavy black outline.
    g.polygon(pointsAttr([{ x: c.x, y: c.y - h - 0.8 }, { x: c.x + h + 0.8, y: c.y + h }, { x: c.x - h - 0.8, y: c.y + h }]))
      .fill(PAPER)
      .stroke({ color: WARNING_INK, width: 1.1 });
    addText(g, String(badge.number), c.x, c.y + 3.6, { size: BADGE_FONT, anchor: 'middle', weight: 'bold' });
  } else {
    g.circle(BADGE).attr({ cx: r2(c.x), cy: r2(c.y) }).fill('#ffffff').stroke({ color: '#000000', width: 0.6 });
    addText(g, String(badge.number), c.x, c.y + 2.9, { size: BADGE_FONT, anchor: 'middle' });
  }
}


/**
 * Draws the wiring schematic: amplifier channels (with computed load, with and without cable, and the
 * amplifier's minimum) → runs (labelled with run and gauge) → wall entries and splices → speakers and
 * subwoofers (impedance or tap, cable loss). Laid out with elkjs `layered`, orthogonal edges; spare,
 * abandoned and channel-less runs dashed. Each finding gets a numbered badge (octagon critical,
 * triangle warning, circle note) on the node or edge it points at and a line in the list underneath.
 * Scaled to fit the printable width of the sheet.
 */
export async function drawWiringSchematic(asBuilt: AsBuilt, analysis: AsBuiltAnalysis, options: WiringSchematicOptions): Promise<string> {
  const { nodes, edges } = buildGraph(asBuilt, analysis, options.showFindings === false ? 0 : BADGE + 2);
  // 'auto' tries both directions on jobs of ordinary size; a very large graph (each layout takes seconds)
  // goes DOWN, which suits wide trees of speakers.
  const isAuto = options.direction === undefined || options.direction === 'auto';
  const directions: ('RIGHT' | 'DOWN')[] = isAuto ? (nodes.length > AUTO_DIRECTION_MAX_NODES ? ['DOWN'] : ['RIGHT', 'DOWN']) : [options.direction as 'RIGHT' | 'DOWN'];

  // Parts not connected to any channel (spare runs, abandoned runs, unassigned speakers) are laid out
  // on their own and drawn underneath, so they do not widen the channel trees.
  const live = connectedToChannels(nodes, edges);
  const parts = [
    { nodes: nodes.filter((n) => live.has(n.id)), edges: edges.filter((e) => live.has(e.source)) },
    { nodes: nodes.filter((n) => !live.has(n.id)), edges: edges.filter((e) => !live.has(e.source)) },
  ];
  const layouts: { direction: string; graph: ElkNode }[][] = [];
  for (const part of parts) {
    if (part.nodes.length === 0) continue;
    const options: { direction: string; graph: ElkNode }[] = [];
    for (const direction of directions) options.push({ direction, graph: await layout(part.nodes, part.edges, direction) });
    layouts.push(options);
  }
  const hasUnconnected = parts[1]!.nodes.length > 0;
  const units = options.units ?? asBuilt.units?.length ?? 'metric';
  const listed: { badge: Badge; finding: Finding }[] =
    options.showFindings === false ? [] : analysis.findings.map((finding, i) => ({ badge: { number: i + 1, severity: finding.severity }, finding }));
  const headerH = 16;
  const unconnectedHeadH = 14;
  const listLineH = LIST_FONT * LINE_HEIGHT_EM;

  // The sheet: on 'auto', portrait or landscape, whichever prints the graph larger (its text shrinks with
  // it and must stay at 8 pt); the graph is scaled to the sheet's width and to what its height leaves.
  const orientations: Orientation[] = options.orientation === 'auto' ? ['portrait', 'landscape'] : [options.orientation ?? 'portrait'];
  let sheet:
    | { area: ReturnType<typeof printableArea>; laidOut: { graph: ElkNode; direction: string }[]; scale: number; listLines: string[][]; listH: number }
    | undefined;
  for (const orientation of orientations) {
    const area = printableArea(options.paper ?? 'letter', orientation, options.headroomPt ?? 0, options.margins);
    const width = area.widthPt;
    const listLines = listed.map(({ badge, finding }) => wrapToWidth(`${FINDING_SEVERITY_LABELS[badge.severity]}: ${findingText(finding, units)}`, width - BADGE - 6, LIST_FONT));
    const listH = options.showFindings === false ? 0 : listed.length === 0 ? 14 : 16 + listLines.reduce((sum, l) => sum + Math.max(l.length * listLineH, BADGE) + 3, 0);
    const roomH = area.heightPt - headerH - 8 - listH - (hasUnconnected ? unconnectedHeadH : 0);
    // Every choice of direction per part (at most 2 × 2): one scale for every part, so the text is the
    // same size throughout, no wider than the sheet and no taller than the room the list leaves.
    let combos: { direction: string; graph: ElkNode }[][] = [[]];
    for (const choices of layouts) combos = combos.flatMap((combo) => choices.map((c) => [...combo, c]));
    for (const laidOut of combos) {
      const graphsH = laidOut.reduce((sum, l) => sum + (l.graph.height ?? 0), 0);
      const byWidth = Math.min(1, ...laidOut.map((l) => width / (l.graph.width ?? 1)));
      const scale = roomH > 0 && graphsH > 0 ? Math.min(byWidth, roomH / graphsH) : byWidth;
      if (sheet === undefined || scale > sheet.scale + 1e-9) sheet = { area, laidOut, scale, listLines, listH };
    }
  }
  const { area, laidOut, scale, listLines, listH } = sheet!;
  const W = area.widthPt;
  const direction = laidOut[0]?.direction ?? 'DOWN';


  // Findings → numbered badges on their targets.
  const badgesByTarget = new Map<string, Badge[]>();
  for (const { badge, finding } of listed) {
    const target = findingTarget(finding, asBuilt);
    if (target === null) continue;
    const list = badgesByTarget.get(target);
    if (list === undefined) badgesByTarget.set(target, [badge]);
    else list.push(badge);
  }
  const graphH = laidOut.reduce((sum, l) => sum + (l.graph.height ?? 0) * scale, 0) + (hasUnconnected ? unconnectedHeadH : 0);
  const H = headerH + graphH + 8 + listH;

  const canvas = options.createCanvas();
  canvas.attr({
    width: `${r2(W / 72)}in`,
    height: `${r2(H / 72)}in`,
    'data-drawing': 'wiring-schematic',
    'data-direction': direction,
    'data-scale': r2(scale),
    // The smallest text as printed: the graph's text shrinks with the graph.
    'data-min-text-pt': r2(Math.min(LIST_FONT, Math.min(EDGE_FONT, NODE_DETAIL_FONT, BADGE_FONT, POLARITY_FONT) * scale)),
  });
  canvas.viewbox(0, 0, r2(W), r2(H));
  canvas.rect(r2(W), r2(H)).fill('#ffffff');
  addText(canvas, 'WIRING SCHEMATIC — amplifier channels to speakers (not to scale)', 0, 10, { size: 8.5, weight: 'bold' });

  const edgeById = new Map(edges.map((e) => [e.id, e]));
  const nodeById = new Map(nodes.map((n) => [n.id, n]));
  let top = headerH;
  laidOut.forEach(({ graph }, partIndex) => {
    if (partIndex === 1) {
      addText(canvas, 'Not connected to an amplifier channel (spare, abandoned or unassigned):', 0, top + 10, { size: 8, weight: 'bold', italic: true });
      top += unconnectedHeadH;
    }
    const root = canvas.group().attr({ transform: `translate(0 ${r2(top)}) scale(${r2(scale * 1000) / 1000})`, 'data-layer': partIndex === 0 ? 'graph' : 'unconnected' });
    top += (graph.height ?? 0) * scale;
    for (const elkEdge of graph.edges ?? []) {
      const edge = edgeById.get(elkEdge.id)!;
      const g = root.group().attr({ 'data-id': edge.runId, 'data-kind': 'run', 'data-edge': edge.id, 'data-dead': String(edge.isDead) });
      for (const section of elkEdge.sections ?? []) {
        const pts = [section.startPoint, ...(section.bendPoints ?? []), section.endPoint];
        // Runs in the palette's orange (APWA: signal cable); a run carrying no channel is thinner and dashed.
        const line = g
          .polyline(pointsAttr(pts))
          .fill('none')
          .stroke({ color: RUN_ORANGE, width: edge.isDead ? 0.8 : 1.2 })
          .attr('data-role', 'run-stroke');
        if (edge.isDead) line.attr('stroke-dasharray', '4 2.5');
        const end = pts[pts.length - 1]!;
        const prev = pts[pts.length - 2]!;
        const len = Math.hypot(end.x - prev.x, end.y - prev.y) || 1;
        const ux = (end.x - prev.x) / len;
        const uy = (end.y - prev.y) / len;
        g.polygon(pointsAttr([end, { x: end.x - ux * 4 - uy * 1.8, y: end.y - uy * 4 + ux * 1.8 }, { x: end.x - ux * 4 + uy * 1.8, y: end.y - uy * 4 - ux * 1.8 }])).fill(
          RUN_ORANGE,
        );
        if (!edge.isDead) drawPolarity(g, pts);
      }
      const label = elkEdge.labels?.[0];
      if (label !== undefined) {
        const lx = label.x ?? 0;
        const ly = label.y ?? 0;
        edge.lines.forEach((line, i) => {
          addText(g, line, lx + 1, ly + 1 + EDGE_FONT * (BASELINE_EM + i * LINE_HEIGHT_EM), { size: EDGE_FONT, halo: true, weight: i < edge.boldCount ? 'bold' : 'normal' });
        });
        (badgesByTarget.get(`run:${edge.runId}`) ?? []).forEach((badge, i) => drawBadge(g, badge, lx - BADGE - 1 - i * (BADGE + 1), ly));
      }
    }
    for (const elkNode of graph.children ?? []) {
      const node = nodeById.get(elkNode.id)!;
      const x = elkNode.x ?? 0;
      const y = elkNode.y ?? 0;
      const g = root.group().attr({ 'data-id': node.forId, 'data-kind': node.kind, 'data-node': node.id });
      const isChannel = node.kind === 'channel';
      const rect = g.rect(node.width, node.height).attr({ x: r2(x), y: r2(y), rx: node.kind === 'junction' || node.kind === 'wall_entry' ? 0 : 3 });
      rect.fill(isChannel ? '#fdf0e6' : '#ffffff').stroke({ color: '#000000', width: isChannel ? 1.3 : 0.8 });
      if (node.kind === 'spare_end') rect.attr('stroke-dasharray', '3 2');
      node.lines.forEach((line, i) => {
        addText(g, line, x + NODE_PAD, y + NODE_PAD + NODE_FONT * (BASELINE_EM + i * LINE_HEIGHT_EM), {
          size: i < node.boldCount ? NODE_FONT : NODE_DETAIL_FONT,
          weight: i < node.boldCount ? 'bold' : 'normal',
        }).attr(isChannel && i === node.boldCount ? { 'data-role': 'channel-load' } : {});
      });
      const target = isChannel ? `ch:${node.forId}` : `item:${node.forId}`;
      (badgesByTarget.get(target) ?? []).forEach((badge, i) => drawBadge(g, badge, x + node.width - BADGE - 1 - i * (BADGE + 1), y + 1));
    }
  });

  // Findings list.
  if (options.showFindings === false) return canvas.svg();
  const list = canvas.group().attr('data-layer', 'findings');
  let y = headerH + graphH + 8;
  if (listed.length === 0) {
    addText(list, 'No findings.', 0, y + 9, { size: LIST_FONT, italic: true });
  } else {
    addText(list, 'Findings', 0, y + 9, { size: 9, weight: 'bold' });
    y += 16;
    listed.forEach(({ badge }, i) => {
      drawBadge(list, badge, 0, y - 1);
      const top = y;
      for (const line of listLines[i]!) {
        addText(list, line, BADGE + 6, y + LIST_FONT * BASELINE_EM, { size: LIST_FONT });
        y += listLineH;
      }
      y = Math.max(y, top + BADGE) + 3;
    });
  }
  return canvas.svg();
}
