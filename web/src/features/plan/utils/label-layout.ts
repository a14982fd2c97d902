export type PlacedLabel = { x: number; y: number; textAnchor: 'start' | 'middle' | 'end' };

type LabelBase = { id: string; text: string; fontSize: number; isPinned?: boolean };

/**
 * A name to place, in screen pixels. `isPinned`: shown even where it overlaps (the selected item or
 * landmark). Either a symbol's name (an item, a reference point): a symbol sits at (x, y), every label
 * keeps clear of it, and its own name goes around it; or a landmark's name (a site feature): nothing is
 * drawn at one point, so `spots` says where the name may go, best first (see landmarkSpots).
 */
export type LabelRequest = (LabelBase & { x: number; y: number }) | (LabelBase & { spots: readonly PlacedLabel[] });

export type Box = { left: number; top: number; right: number; bottom: number };

/** Roughly how wide a line of the UI font is: 0.58 em per character (a guess on the safe side, not a measurement). */
const EM_PER_CHAR = 0.58;
/** Half the size of a symbol, pixels: labels keep clear of every symbol. */
const SYMBOL_HALF = 11;
const GAP = 15;
/**
 * Kept free along the frame's edges, pixels: the plan's frame has a 1 px border and rounded corners,
 * and a name touching the edge reads as cut off.
 */
export const EDGE_PX = 4;

function labelWidth(label: Pick<LabelBase, 'text' | 'fontSize'>): number {
  return label.text.length * label.fontSize * EM_PER_CHAR;
}

export function labelBox(label: Pick<LabelBase, 'text' | 'fontSize'>, placed: PlacedLabel): Box {
  const width = labelWidth(label);
  const left = placed.textAnchor === 'start' ? placed.x : placed.textAnchor === 'end' ? placed.x - width : placed.x - width / 2;
  return { left, right: left + width, top: placed.y - label.fontSize, bottom: placed.y + 3 };
}

export function boxesOverlap(a: Box, b: Box): boolean {
  return a.left < b.right && b.left < a.right && a.top < b.bottom && b.top < a.bottom;
}

/** Where a symbol's name may go around it: beside, above, below, then the corners, then the same farther out. */
function spotsAround(label: { x: number; y: number; fontSize: number }): PlacedLabel[] {
  const spots: PlacedLabel[] = [];
  const middle = label.fontSize / 3;
  for (const gap of [GAP, GAP * 2]) {
    spots.push(
      { x: label.x + gap, y: label.y + middle, textAnchor: 'start' },
      { x: label.x - gap, y: label.y + middle, textAnchor: 'end' },
      { x: label.x, y: label.y - gap, textAnchor: 'middle' },
      { x: label.x, y: label.y + gap + label.fontSize, textAnchor: 'middle' },
      { x: label.x + gap * 0.7, y: label.y - gap * 0.7, textAnchor: 'start' },
      { x: label.x + gap * 0.7, y: label.y + gap * 0.7 + label.fontSize, textAnchor: 'start' },
      { x: label.x - gap * 0.7, y: label.y - gap * 0.7, textAnchor: 'end' },
      { x: label.x - gap * 0.7, y: label.y + gap * 0.7 + label.fontSize, textAnchor: 'end' },
    );
  }
  return spots;
}

type ScreenPoint = { x: number; y: number };

/** The point a `fraction` of the way along a polyline, by length. */
function pointAlong(points: readonly ScreenPoint[], fraction: number): ScreenPoint {
  const lengths = points.slice(1).map((p, i) => Math.hypot(p.x - points[i]!.x, p.y - points[i]!.y));
  let remaining = lengths.reduce((a, b) => a + b, 0) * fraction;
  for (const [i, length] of lengths.entries()) {
    if (remaining <= length && length > 0) {
      const t = remaining / length;
      return { x: points[i]!.x + (points[i + 1]!.x - points[i]!.x) * t, y: points[i]!.y + (points[i + 1]!.y - points[i]!.y) * t };
    }
    remaining -= length;
  }
  return points[points.length - 1]!;
}

/** The area centroid of a polygon (shoelace formula); the mean of its corners when it has no area. */
function centroidOf(points: readonly ScreenPoint[]): ScreenPoint {
  let area = 0;
  let cx = 0;
  let cy = 0;
  for (const [i, p] of points.entries()) {
    const q = points[(i + 1) % points.length]!;
    const cross = p.x * q.y - q.x * p.y;
    area += cross;
    cx += (p.x + q.x) * cross;
    cy += (p.y + q.y) * cross;
  }
  if (Math.abs(area) < 1e-9) return { x: points.reduce((a, p) => a + p.x, 0) / points.length, y: points.reduce((a, p) => a + p.y, 0) / points.length };
  return { x: cx / (3 * area), y: cy / (3 * area) };
}

/** Whether the segment a–b passes through the box (Liang–Barsky clipping of the segment to the box). */
function segmentCrossesBox(a: ScreenPoint, b: ScreenPoint, box: Box): boolean {
  const dx = b.x - a.x;
  const dy = b.y - a.y;
  let t0 = 0;
  let t1 = 1;
  for (const [p, q] of [
    [-dx, a.x - box.left],
    [dx, box.right - a.x],
    [-dy, a.y - box.top],
    [dy, box.bottom - a.y],
  ] as const) {
    if (p === 0) {
      if (q < 0) return false;
      continue;
    }
    const t = q / p;
    if (p < 0) t0 = Math.max(t0, t);
    else t1 = Math.min(t1, t);
    if (t0 > t1) return false;
  }
  return true;
}

function crossesAnyLine(box: Box, lines: readonly (readonly ScreenPoint[])[]): boolean {
  return lines.some((line) => line.slice(1).some((p, i) => segmentCrossesBox(line[i]!, p, box)));
}

/** Whether a point lies inside a polygon (even-odd ray cast). */
function isInside(p: ScreenPoint, polygon: readonly ScreenPoint[]): boolean {
  let inside = false;
  for (const [i, a] of polygon.entries()) {
    const b = polygon[(i + polygon.length - 1) % polygon.length]!;
    if (a.y > p.y !== b.y > p.y && p.x < ((b.x - a.x) * (p.y - a.y)) / (b.y - a.y) + a.x) inside = !inside;
  }
  return inside;
}

/**
 * Where a landmark's name may go, screen pixels, best first. An area (house, patio, pool): centred on
 * its centroid, then a line above or below that, and the same around the middle of the part in view (if
 * that lies inside the area; first, when the centroid is off screen), each moved sideways as far as the
 * frame needs while it stays over the area (a long name near the edge); then just outside its outline,
 * right, left, above, below. A line (fence, path, water line): just above it, then just below, at its
 * middle, then farther along each way, so that a name finds room beside the line and never hides it.
 */
export function landmarkSpots(
  shape: 'polygon' | 'line',
  points: readonly ScreenPoint[],
  label: Pick<LabelBase, 'text' | 'fontSize'>,
  view: { width: number; height: number },
): PlacedLabel[] {
  if (points.length === 0) return [];
  const { fontSize } = label;
  const middle = fontSize / 3;
  if (shape === 'polygon') {
    const centroid = centroidOf(points);
    const anchors = [centroid];
    const xs = points.map((p) => Math.min(Math.max(p.x, 0), view.width));
    const ys = points.map((p) => Math.min(Math.max(p.y, 0), view.height));
    const visibleMiddle = { x: (Math.min(...xs) + Math.max(...xs)) / 2, y: (Math.min(...ys) + Math.max(...ys)) / 2 };
    if (Math.hypot(visibleMiddle.x - centroid.x, visibleMiddle.y - centroid.y) > fontSize && isInside(visibleMiddle, points)) {
      const isCentroidInView = centroid.x >= 0 && centroid.x <= view.width && centroid.y >= 0 && centroid.y <= view.height;
      if (isCentroidInView) anchors.push(visibleMiddle);
      else anchors.unshift(visibleMiddle);
    }
    const box = { left: Math.min(...points.map((p) => p.x)), right: Math.max(...points.map((p) => p.x)), top: Math.min(...points.map((p) => p.y)), bottom: Math.max(...points.map((p) => p.y)) };
    const halfWidth = labelWidth(label) / 2;
    const fitX = (x: number): number => {
      const shifted = Math.min(Math.max(x, EDGE_PX + halfWidth), view.width - EDGE_PX - halfWidth);
      return shifted >= box.left && shifted <= box.right ? shifted : x;
    };
    const inside = anchors.flatMap((a) => [
      { x: fitX(a.x), y: a.y + middle, textAnchor: 'middle' as const },
      { x: fitX(a.x), y: a.y + middle - fontSize - 4, textAnchor: 'middle' as const },
      { x: fitX(a.x), y: a.y + middle + fontSize + 4, textAnchor: 'middle' as const },
    ]);
    // A small area (a tree, a spa, a bed) has no room inside for its name: then beside its outline.
    const centre = { x: (box.left + box.right) / 2, y: (box.top + box.bottom) / 2 };
    const beside: PlacedLabel[] = [
      { x: box.right + 4, y: centre.y + middle, textAnchor: 'start' },
      { x: box.left - 4, y: centre.y + middle, textAnchor: 'end' },
      { x: centre.x, y: box.top - 4, textAnchor: 'middle' },
      { x: centre.x, y: box.bottom + fontSize + 2, textAnchor: 'middle' },
    ];
    return [...inside, ...beside];
  }
  return [0.5, 0.35, 0.65, 0.2, 0.8, 0.08, 0.92].flatMap((fraction) => {
    const p = pointAlong(points, fraction);
    return [
      { x: p.x, y: p.y - 5, textAnchor: 'middle' as const },
      { x: p.x, y: p.y + fontSize + 2, textAnchor: 'middle' as const },
    ];
  });
}

export type LayoutOptions = {
  /** The controls laid over the plan (zoom buttons, hint, north arrow, scale bar): no name goes under them. */
  blocked?: readonly Box[];
  /** The cable runs, screen polylines: a landmark's name takes a spot off them when it has one. */
  lines?: readonly (readonly ScreenPoint[])[];
};

/**
 * Places each name: the first of its spots (around its symbol, or a landmark's own) that lies inside the
 * frame (less EDGE_PX), off every `blocked` box and clear of every symbol and of the names placed before
 * it (greedy, in the order given, so put the most important first); a landmark's name prefers a clear
 * spot that no run crosses (the runs are the record; the landmark only orients). A name with no clear
 * spot is left out of the map: names written over each other, or under a button, can be read by nobody,
 * and zooming in (names are laid out again in screen pixels) or tapping the symbol shows it. A pinned
 * name (the selected item or landmark) is placed all the same, first, on a spot off the controls when it
 * has one.
 */
export function layoutLabels(labels: readonly LabelRequest[], view: { width: number; height: number }, options: LayoutOptions = {}): Map<string, PlacedLabel> {
  const { blocked = [], lines = [] } = options;
  const symbols: Box[] = labels.flatMap((l) => ('spots' in l ? [] : [{ left: l.x - SYMBOL_HALF, right: l.x + SYMBOL_HALF, top: l.y - SYMBOL_HALF, bottom: l.y + SYMBOL_HALF }]));
  const taken: Box[] = [];
  const out = new Map<string, PlacedLabel>();
  const ordered = [...labels.filter((l) => l.isPinned), ...labels.filter((l) => !l.isPinned)];
  for (const label of ordered) {
    const candidates = 'spots' in label ? label.spots : spotsAround(label);
    const inView = candidates.filter((c) => {
      const b = labelBox(label, c);
      return b.left >= EDGE_PX && b.right <= view.width - EDGE_PX && b.top >= EDGE_PX && b.bottom <= view.height - EDGE_PX;
    });
    const usable = inView.filter((c) => !blocked.some((box) => boxesOverlap(labelBox(label, c), box)));
    const clearSpots = usable.filter((c) => {
      const b = labelBox(label, c);
      return !taken.some((t) => boxesOverlap(b, t)) && !symbols.some((s) => boxesOverlap(b, s));
    });
    const clear = 'spots' in label && lines.length > 0 ? (clearSpots.find((c) => !crossesAnyLine(labelBox(label, c), lines)) ?? clearSpots[0]) : clearSpots[0];
    const chosen = clear ?? (label.isPinned ? (usable[0] ?? inView[0] ?? candidates[0]) : undefined);
    if (!chosen) continue;
    out.set(label.id, chosen);
    taken.push(labelBox(label, chosen));
  }
  return out;
}
