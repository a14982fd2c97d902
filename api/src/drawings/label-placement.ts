import { boxContains, boxesIntersect, type Box, type Point } from './text-box.js';

/** One label to place: a box of known size that belongs to an anchor (a symbol, a line's midpoint …). */
export interface LabelRequest {
  id: string;
  width: number;
  height: number;
  /** Higher is placed first and so gets the best spot. */
  priority: number;
  /** The point a leader line is drawn to when the label has to move away from its preferred spots. */
  anchor: Point;
  /** Box centres that need no leader, best first (e.g. right of the symbol, left of it, above …). */
  preferred: readonly Point[];
  /** False: only the preferred spots are tried (for labels a leader would make ambiguous). Default true. */
  allowDisplacement?: boolean;
  /** Ids of the `lines` this label may lie across (a run's label may touch its own run); others never. */
  ownLines?: readonly string[];
}

/** A drawn polyline labels must not lie across (a cable run), with the id that owns it. */
export interface LineObstacle {
  id: string;
  points: readonly Point[];
}

export interface PlacedLabel {
  id: string;
  box: Box;
  /** Line from the anchor to the nearest point of the box, when the label was displaced. */
  leader: { from: Point; to: Point } | null;
}

export interface LabelPlacementOptions {
  /** Labels must lie wholly inside this box (the drawing frame). */
  bounds: Box;
  /** Symbols: labels avoid covering them whenever any other spot is free (cost 60 per symbol covered). */
  obstacles?: readonly Box[];
  /** Samples along lines (see `lineObstacles`): covering them costs a little (1.5 per sample). */
  softObstacles?: readonly Box[];
  /**
   * Lines no label may lie across unless it owns them (`LabelRequest.ownLines`): a candidate whose box
   * any segment of another line crosses is never chosen, so a label with no spot clear of them within
   * `maxRings` is left off (reported in `unplaced`, for the drawing to count).
   */
  lines?: readonly LineObstacle[];
  /** Clear space kept between a label box and the centre of those lines (half a stroke and a little), pt. Default 1. */
  lineClearance?: number;
  /** Minimum clear space between two label boxes, pt. */
  gap?: number;
  /** Distance between rings of displaced candidates, pt. */
  ringStep?: number;
  /** How many rings of displaced candidates to try before giving up on a label. */
  maxRings?: number;
}

export interface LabelPlacementResult {
  placed: PlacedLabel[];
  /** Ids of labels for which no free spot was found within `maxRings` rings: they are left off. */
  unplaced: string[];
}

/** A uniform grid of boxes for fast "does this box hit anything" queries. */
class BoxGrid {
  private readonly cells = new Map<string, number[]>();
  private readonly boxes: Box[] = [];

  constructor(private readonly cellSize: number) {}

  add(box: Box): void {
    const index = this.boxes.length;
    this.boxes.push(box);
    for (const key of this.keys(box, 0)) {
      const list = this.cells.get(key);
      if (list === undefined) this.cells.set(key, [index]);
      else list.push(index);
    }
  }

  hits(box: Box, gap: number): boolean {
    for (const key of this.keys(box, gap)) {
      for (const i of this.cells.get(key) ?? []) {
        if (boxesIntersect(box, this.boxes[i]!, gap)) return true;
      }
    }
    return false;
  }

  count(box: Box): number {
    const seen = new Set<number>();
    for (const key of this.keys(box, 0)) {
      for (const i of this.cells.get(key) ?? []) {
        if (!seen.has(i) && boxesIntersect(box, this.boxes[i]!)) seen.add(i);
      }
    }
    return seen.size;
  }

  private keys(box: Box, gap: number): string[] {
    const x0 = Math.floor((box.x - gap) / this.cellSize);
    const x1 = Math.floor((box.x + box.width + gap) / this.cellSize);
    const y0 = Math.floor((box.y - gap) / this.cellSize);
    const y1 = Math.floor((box.y + box.height + gap) / this.cellSize);
    const keys: string[] = [];
    for (let i = x0; i <= x1; i += 1) for (let j = y0; j <= y1; j += 1) keys.push(`${i},${j}`);
    return keys;
  }
}

/** Whether the segment a–b meets the box (Liang–Barsky clipping; touching the edge counts). */
export function segmentIntersectsBox(a: Point, b: Point, box: Box): boolean {
  const dx = b.x - a.x;
  const dy = b.y - a.y;
  let t0 = 0;
  let t1 = 1;
  const edges: [number, number][] = [
    [-dx, a.x - box.x],
    [dx, box.x + box.width - a.x],
    [-dy, a.y - box.y],
    [dy, box.y + box.height - a.y],
  ];
  for (const [p, q] of edges) {
    if (p === 0) {
      if (q < 0) return false;
    } else {
      const t = q / p;
      if (p < 0) t0 = Math.max(t0, t);
      else t1 = Math.min(t1, t);
      if (t0 > t1) return false;
    }
  }
  return true;
}

/** Whether segments p–q and a–b properly cross (sharing an end point does not count). */
function segmentsCross(p: Point, q: Point, a: Point, b: Point): boolean {
  const side = (o: Point, u: Point, v: Point) => (u.x - o.x) * (v.y - o.y) - (u.y - o.y) * (v.x - o.x);
  const d1 = side(a, b, p);
  const d2 = side(a, b, q);
  const d3 = side(p, q, a);
  const d4 = side(p, q, b);
  return ((d1 > 0 && d2 < 0) || (d1 < 0 && d2 > 0)) && ((d3 > 0 && d4 < 0) || (d3 < 0 && d4 > 0));
}

/** The segments of owned lines in a uniform grid, for "does this box lie across a line it does not own". */
class SegmentGrid {
  private readonly cells = new Map<string, number[]>();
  private readonly segments: { owner: string; a: Point; b: Point }[] = [];

  constructor(private readonly cellSize: number) {}

  add(owner: string, a: Point, b: Point): void {
    const index = this.segments.length;
    this.segments.push({ owner, a, b });
    const x0 = Math.floor(Math.min(a.x, b.x) / this.cellSize);
    const x1 = Math.floor(Math.max(a.x, b.x) / this.cellSize);
    const y0 = Math.floor(Math.min(a.y, b.y) / this.cellSize);
    const y1 = Math.floor(Math.max(a.y, b.y) / this.cellSize);
    for (let i = x0; i <= x1; i += 1) {
      for (let j = y0; j <= y1; j += 1) {
        // Only the cells the segment passes through (a long diagonal would otherwise fill its whole bounding box).
        const cell = { x: i * this.cellSize, y: j * this.cellSize, width: this.cellSize, height: this.cellSize };
        if (!segmentIntersectsBox(a, b, cell)) continue;
        const key = `${i},${j}`;
        const list = this.cells.get(key);
        if (list === undefined) this.cells.set(key, [index]);
        else list.push(index);
      }
    }
  }

  /** The segments in the grid cells that `box` touches (a segment in two cells comes twice). */
  private *segmentsNear(box: Box): Generator<{ a: Point; b: Point; owner: string }> {
    const x0 = Math.floor(box.x / this.cellSize);
    const x1 = Math.floor((box.x + box.width) / this.cellSize);
    const y0 = Math.floor(box.y / this.cellSize);
    const y1 = Math.floor((box.y + box.height) / this.cellSize);
    for (let i = x0; i <= x1; i += 1) {
      for (let j = y0; j <= y1; j += 1) {
        for (const k of this.cells.get(`${i},${j}`) ?? []) yield this.segments[k]!;
      }
    }
  }

  /** How many lines not in `own` the segment p–q crosses (a leader line drawn over other runs). */
  countCrossings(p: Point, q: Point, own: readonly string[]): number {
    const box = { x: Math.min(p.x, q.x), y: Math.min(p.y, q.y), width: Math.abs(q.x - p.x), height: Math.abs(q.y - p.y) };
    const crossed = new Set<string>();
    for (const s of this.segmentsNear(box)) {
      if (!own.includes(s.owner) && !crossed.has(s.owner) && segmentsCross(p, q, s.a, s.b)) crossed.add(s.owner);
    }
    return crossed.size;
  }

  /** True when a segment of a line not in `own` meets the box. */
  crosses(box: Box, own: readonly string[]): boolean {
    for (const s of this.segmentsNear(box)) {
      if (!own.includes(s.owner) && segmentIntersectsBox(s.a, s.b, box)) return true;
    }
    return false;
  }
}

/** Ring directions, degrees (y down): the four sides first, then the diagonals, then the rest. */
const RING_ANGLES = [0, 180, 270, 90, 315, 225, 45, 135, 337.5, 202.5, 292.5, 247.5, 22.5, 157.5, 67.5, 112.5];

const SYMBOL_COST = 60;
const LINE_SAMPLE_COST = 1.5;
const PREFERRED_STEP_COST = 0.3;
const DISPLACED_BASE_COST = 8;
const DISPLACED_RING_COST = 2;
const LEADER_CROSSING_COST = 12;

function boxAt(centre: Point, width: number, height: number): Box {
  return { x: centre.x - width / 2, y: centre.y - height / 2, width, height };
}

function nearestPointOnBox(box: Box, p: Point): Point {
  return {
    x: Math.min(Math.max(p.x, box.x), box.x + box.width),
    y: Math.min(Math.max(p.y, box.y), box.y + box.height),
  };
}

/**
 * Greedy label placement with displacement. Labels are taken by priority (then larger first, then id,
 * so the result is deterministic). For each label, every candidate spot inside `bounds` that keeps
 * `gap` clear of the labels already placed is scored, and the cheapest wins:
 * - preferred spots (beside the symbol or the line) cost 0.3 per step down the preference list;
 * - displaced spots, on rings of growing radius around the anchor (16 directions per ring), cost
 *   8 + 2 per ring and get a leader line;
 * - covering a symbol adds 60 (more than the farthest ring), covering a line sample 1.5;
 * - a displaced spot whose leader would cross a line of `lines` the label does not own adds 12 per line;
 * - a spot across a line of `lines` the label does not own is never taken.
 * Placed labels never overlap each other; a label with no free spot at all is reported in `unplaced`.
 */
export function placeLabels(requests: readonly LabelRequest[], options: LabelPlacementOptions): LabelPlacementResult {
  const gap = options.gap ?? 1;
  const ringStep = options.ringStep ?? 6;
  const maxRings = options.maxRings ?? 14;
  const lineClearance = options.lineClearance ?? 1;
  const labels = new BoxGrid(48);
  const symbols = new BoxGrid(48);
  const lines = new BoxGrid(24);
  for (const box of options.obstacles ?? []) symbols.add(box);
  for (const box of options.softObstacles ?? []) lines.add(box);
  const hardLines = new SegmentGrid(24);
  for (const line of options.lines ?? []) {
    for (let i = 0; i + 1 < line.points.length; i += 1) hardLines.add(line.id, line.points[i]!, line.points[i + 1]!);
  }

  // Ties are broken by where the label belongs before its id: a recorded job's ids are random uuids, and
  // ordering by them alone would move labels between two copies of the same job.
  const order = [...requests].sort(
    (a, b) =>
      b.priority - a.priority ||
      b.width * b.height - a.width * a.height ||
      a.anchor.y - b.anchor.y ||
      a.anchor.x - b.anchor.x ||
      (a.id < b.id ? -1 : a.id > b.id ? 1 : 0),
  );
  const placed: PlacedLabel[] = [];
  const unplaced: string[] = [];

  for (const request of order) {
    // Candidates in order of their base cost, so the search can stop once no later one can win.
    const candidates: { box: Box; base: number; isDisplaced: boolean }[] = request.preferred.map((c, i) => ({
      box: boxAt(c, request.width, request.height),
      base: i * PREFERRED_STEP_COST,
      isDisplaced: false,
    }));
    for (let ring = 1; ring <= (request.allowDisplacement === false ? 0 : maxRings); ring += 1) {
      const d = ring * ringStep;
      for (const deg of RING_ANGLES) {
        const rad = (deg * Math.PI) / 180;
        const centre = { x: request.anchor.x + Math.cos(rad) * (d + request.width / 2), y: request.anchor.y + Math.sin(rad) * (d + request.height / 2) };
        candidates.push({ box: boxAt(centre, request.width, request.height), base: DISPLACED_BASE_COST + ring * DISPLACED_RING_COST, isDisplaced: true });
      }
    }
    candidates.sort((a, b) => a.base - b.base);

    let best: { box: Box; cost: number; isDisplaced: boolean } | undefined;
    for (const c of candidates) {
      if (best !== undefined && c.base >= best.cost) break;
      if (!boxContains(options.bounds, c.box) || labels.hits(c.box, gap)) continue;
      const clear = { x: c.box.x - lineClearance, y: c.box.y - lineClearance, width: c.box.width + 2 * lineClearance, height: c.box.height + 2 * lineClearance };
      if (hardLines.crosses(clear, request.ownLines ?? [])) continue;
      let cost = c.base + symbols.count(c.box) * SYMBOL_COST + lines.count(c.box) * LINE_SAMPLE_COST;
      if (c.isDisplaced) {
        const end = nearestPointOnBox(c.box, request.anchor);
        cost += hardLines.countCrossings(request.anchor, end, request.ownLines ?? []) * LEADER_CROSSING_COST;
      }
      if (best === undefined || cost < best.cost) best = { box: c.box, cost, isDisplaced: c.isDisplaced };
    }
    if (best === undefined) {
      unplaced.push(request.id);
      continue;
    }
    labels.add(best.box);
    let leader: PlacedLabel['leader'] = null;
    if (best.isDisplaced) {
      const to = nearestPointOnBox(best.box, request.anchor);
      if (Math.hypot(to.x - request.anchor.x, to.y - request.anchor.y) > 3) leader = { from: request.anchor, to };
    }
    placed.push({ id: request.id, box: best.box, leader });
  }
  return { placed, unplaced };
}

/**
 * Small square obstacles every `spacing` pt along a polyline, so that labels keep off other lines
 * where they can.
 */
export function lineObstacles(points: readonly Point[], spacing = 3, half = 1.5): Box[] {
  const out: Box[] = [];
  for (let i = 0; i + 1 < points.length; i += 1) {
    const a = points[i]!;
    const b = points[i + 1]!;
    const steps = Math.max(1, Math.ceil(Math.hypot(b.x - a.x, b.y - a.y) / spacing));
    for (let j = 0; j <= steps; j += 1) {
      const x = a.x + ((b.x - a.x) * j) / steps;
      const y = a.y + ((b.y - a.y) * j) / steps;
      out.push({ x: x - half, y: y - half, width: 2 * half, height: 2 * half });
    }
  }
  return out;
}

/**
 * Preferred centres around a point symbol of radius `r`: right, left, above, below, then the four
 * diagonals, each `gap` clear of the symbol.
 */
export function pointLabelCandidates(p: Point, r: number, width: number, height: number, gap = 2): Point[] {
  const dx = r + gap + width / 2;
  const dy = r + gap + height / 2;
  return [
    { x: p.x + dx, y: p.y },
    { x: p.x - dx, y: p.y },
    { x: p.x, y: p.y - dy },
    { x: p.x, y: p.y + dy },
    { x: p.x + dx, y: p.y - dy },
    { x: p.x - dx, y: p.y - dy },
    { x: p.x + dx, y: p.y + dy },
    { x: p.x - dx, y: p.y + dy },
  ];
}

/**
 * Preferred centres beside a polyline (paper points): at the middle, ¼ and ¾ of each segment, longest
 * segments first, on either side of the line, just clear of it (`gap`) for a horizontal box of the
 * given size.
 */
export function lineLabelCandidates(points: readonly Point[], width: number, height: number, gap = 2): Point[] {
  const segments: { a: Point; b: Point; length: number; index: number }[] = [];
  for (let i = 0; i + 1 < points.length; i += 1) {
    const a = points[i]!;
    const b = points[i + 1]!;
    segments.push({ a, b, length: Math.hypot(b.x - a.x, b.y - a.y), index: i });
  }
  segments.sort((s, t) => t.length - s.length || s.index - t.index);
  const out: Point[] = [];
  for (const s of segments.slice(0, 4)) {
    if (s.length === 0) continue;
    const nx = -(s.b.y - s.a.y) / s.length;
    const ny = (s.b.x - s.a.x) / s.length;
    // Push the box centre far enough along the normal that the box clears the line.
    const push = Math.abs(nx) * (width / 2) + Math.abs(ny) * (height / 2) + gap;
    for (const f of [0.5, 0.35, 0.65, 0.2, 0.8]) {
      const m = { x: s.a.x + (s.b.x - s.a.x) * f, y: s.a.y + (s.b.y - s.a.y) * f };
      out.push({ x: m.x + nx * push, y: m.y + ny * push }, { x: m.x - nx * push, y: m.y - ny * push });
    }
  }
  return out;
}

/** The midpoint of the longest segment of a polyline: where a displaced line label points back to. */
export function lineLabelAnchor(points: readonly Point[]): Point {
  let best: Point = points[0] ?? { x: 0, y: 0 };
  let bestLength = -1;
  for (let i = 0; i + 1 < points.length; i += 1) {
    const a = points[i]!;
    const b = points[i + 1]!;
    const length = Math.hypot(b.x - a.x, b.y - a.y);
    if (length > bestLength) {
      bestLength = length;
      best = { x: (a.x + b.x) / 2, y: (a.y + b.y) / 2 };
    }
  }
  return best;
}
