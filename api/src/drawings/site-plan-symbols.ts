import type { Container } from '@svgdotjs/svg.js';

import type { ItemKind } from '../domain/as-built/item.schema.js';
import type { InstallMethod } from '../domain/as-built/run.schema.js';
import { pointsAttr, r2 } from './svg-canvas.js';
import type { Point } from './text-box.js';
import { FEATURE_FILL, FEATURE_STROKE, LEADER_INK, PAPER, REFERENCE_INK, RUN_ORANGE, RUN_STROKES, WARNING_INK } from './marking-palette.js';

/**
 * Our own symbols, told apart by shape (not colour) so they survive greyscale printing. Each is drawn
 * centred on `p` within a radius of about 5 pt.
 */
export function drawItemSymbol(parent: Container, kind: ItemKind, p: Point): Container {
  const g = parent.group();
  const x = p.x;
  const y = p.y;
  const line = { color: '#000000', width: 0.9 };
  switch (kind) {
    case 'amplifier': {
      // A box with an amplifier triangle inside.
      g.rect(12, 9).attr({ x: r2(x - 6), y: r2(y - 4.5) }).fill('#ffffff').stroke(line);
      g.polygon(pointsAttr([{ x: x - 3, y: y - 3 }, { x: x + 3.5, y }, { x: x - 3, y: y + 3 }])).fill('#000000');
      break;
    }
    case 'speaker': {
      // A ring with a dot: a speaker seen from above.
      g.circle(9).attr({ cx: r2(x), cy: r2(y) }).fill('#ffffff').stroke(line);
      g.circle(3.6).attr({ cx: r2(x), cy: r2(y) }).fill('#000000');
      break;
    }
    case 'subwoofer': {
      // A square enclosure with a ring in it.
      g.rect(10, 10).attr({ x: r2(x - 5), y: r2(y - 5) }).fill('#ffffff').stroke(line);
      g.circle(7).attr({ cx: r2(x), cy: r2(y) }).fill('none').stroke(line);
      g.circle(2.4).attr({ cx: r2(x), cy: r2(y) }).fill('#000000');
      break;
    }
    case 'junction': {
      // A filled diamond: a splice or junction box.
      g.polygon(pointsAttr([{ x, y: y - 5 }, { x: x + 5, y }, { x, y: y + 5 }, { x: x - 5, y }])).fill('#000000').stroke({ color: '#ffffff', width: 0.6 });
      break;
    }
    case 'spare_end': {
      // An open triangle under a cap bar: a capped cable end.
      g.polygon(pointsAttr([{ x: x - 4, y: y - 2 }, { x: x + 4, y: y - 2 }, { x, y: y + 4.5 }])).fill('#ffffff').stroke(line);
      g.rect(10, 2).attr({ x: r2(x - 5), y: r2(y - 4.8) }).fill('#000000');
      break;
    }
    case 'wall_entry': {
      // A square half filled along its diagonal: a sleeve through a wall.
      g.rect(9, 9).attr({ x: r2(x - 4.5), y: r2(y - 4.5) }).fill('#ffffff').stroke(line);
      g.polygon(pointsAttr([{ x: x - 4.5, y: y - 4.5 }, { x: x - 4.5, y: y + 4.5 }, { x: x + 4.5, y: y + 4.5 }])).fill('#000000');
      break;
    }
  }
  return g;
}

/** A survey-style reference point: a ring with a cross through it. */
export function drawReferenceSymbol(parent: Container, p: Point): Container {
  const g = parent.group();
  const stroke = { color: '#000000', width: 0.8 };
  g.circle(7).attr({ cx: r2(p.x), cy: r2(p.y) }).fill('#ffffff').stroke(stroke);
  g.line(r2(p.x - 6), r2(p.y), r2(p.x + 6), r2(p.y)).stroke(stroke);
  g.line(r2(p.x), r2(p.y - 6), r2(p.x), r2(p.y + 6)).stroke(stroke);
  return g;
}

/** Marks a shallow depth reading: an inverted black triangle with a white bar (shape says "warning"; no marking colour). */
export function drawShallowMarker(parent: Container, p: Point): Container {
  const g = parent.group();
  g.polygon(pointsAttr([{ x: p.x - 4.5, y: p.y - 4 }, { x: p.x + 4.5, y: p.y - 4 }, { x: p.x, y: p.y + 4 }]))
    .fill(WARNING_INK)
    .stroke({ color: PAPER, width: 0.6 });
  g.rect(0.9, 3).attr({ x: r2(p.x - 0.45), y: r2(p.y - 3.3) }).fill(PAPER);
  return g;
}

/** Kept for callers that name the cable colour: the palette's run orange. */
export const CABLE_ORANGE = RUN_ORANGE;

/**
 * Draws a run as one stroke (plus crosses for an abandoned run). Every run is orange (APWA: signal
 * cable); weight and dash pattern (marking-palette.ts, RUN_STROKES) tell the kinds apart.
 */
export function drawRunLine(parent: Container, style: InstallMethod | 'spare' | 'abandoned', points: readonly Point[], isRouteRecorded: boolean): Container {
  const g = parent.group();
  const attr = pointsAttr(points);
  const spec = isRouteRecorded ? RUN_STROKES[style] : RUN_STROKES.route_not_recorded;
  const line = g.polyline(attr).fill('none').stroke({ color: spec.color, width: spec.width, linecap: spec.linecap, linejoin: 'round' }).attr('data-role', 'run-stroke');
  if (spec.dash !== undefined) line.attr('stroke-dasharray', spec.dash);
  if (isRouteRecorded && spec.crossesEvery !== undefined) {
    for (const c of crossesAlong(points, spec.crossesEvery)) {
      g.path(`M${r2(c.x - 2.2)} ${r2(c.y - 2.2)}L${r2(c.x + 2.2)} ${r2(c.y + 2.2)}M${r2(c.x - 2.2)} ${r2(c.y + 2.2)}L${r2(c.x + 2.2)} ${r2(c.y - 2.2)}`)
        .fill('none')
        .stroke({ color: spec.color, width: spec.width })
        .attr('data-role', 'run-stroke');
    }
  }
  return g;
}

function crossesAlong(points: readonly Point[], spacing: number): Point[] {
  const out: Point[] = [];
  let next = spacing / 2;
  let travelled = 0;
  for (let i = 0; i + 1 < points.length; i += 1) {
    const a = points[i]!;
    const b = points[i + 1]!;
    const length = Math.hypot(b.x - a.x, b.y - a.y);
    while (next <= travelled + length && length > 0) {
      const f = (next - travelled) / length;
      out.push({ x: a.x + (b.x - a.x) * f, y: a.y + (b.y - a.y) * f });
      next += spacing;
    }
    travelled += length;
  }
  return out;
}

/** A tie drawn as a dimension line: thin, with an arrowhead at each end, stopping short of the symbols. */
export function drawTieLine(parent: Container, from: Point, to: Point): Container {
  const g = parent.group();
  const length = Math.hypot(to.x - from.x, to.y - from.y);
  if (length < 14) return g;
  const ux = (to.x - from.x) / length;
  const uy = (to.y - from.y) / length;
  const a = { x: from.x + ux * 6.5, y: from.y + uy * 6.5 };
  const b = { x: to.x - ux * 6.5, y: to.y - uy * 6.5 };
  const color = REFERENCE_INK;
  g.line(r2(a.x), r2(a.y), r2(b.x), r2(b.y)).stroke({ color, width: 0.45 }).attr('stroke-dasharray', '5 1.5 1 1.5');
  const head = (tip: Point, dx: number, dy: number): void => {
    const back = { x: tip.x - dx * 4, y: tip.y - dy * 4 };
    g.polygon(pointsAttr([tip, { x: back.x - dy * 1.4, y: back.y + dx * 1.4 }, { x: back.x + dy * 1.4, y: back.y - dx * 1.4 }])).fill(color);
  };
  head(a, -ux, -uy);
  head(b, ux, uy);
  return g;
}

/**
 * The area a position solved from ties may lie in: a dashed circle of the solver's accuracy radius,
 * unfilled so the plan image and runs stay visible through it.
 */
export function drawAccuracyCircle(parent: Container, centre: Point, radiusPt: number): Container {
  const g = parent.group();
  g.circle(r2(2 * radiusPt))
    .attr({ cx: r2(centre.x), cy: r2(centre.y), 'stroke-dasharray': '2.5 1.8' })
    .fill('none')
    .stroke({ color: LEADER_INK, width: 0.7 });
  return g;
}

/**
 * A site feature (house, fence, patio …) in muted grey: outlines filled light grey, lines as a grey
 * stroke (fences and walls heavier, paths dashed). Never a marking colour; drawn under everything.
 */
export function drawFeature(parent: Container, feature: { shape: 'polygon' | 'line'; kind: string; points: readonly Point[] }): Container {
  const g = parent.group();
  const attr = pointsAttr(feature.points);
  if (feature.shape === 'polygon') {
    const dash = feature.kind === 'bed' || feature.kind === 'tree' ? '2 1.5' : undefined;
    const poly = g.polygon(attr).fill(FEATURE_FILL).stroke({ color: FEATURE_STROKE, width: feature.kind === 'house' || feature.kind === 'outbuilding' ? 1 : 0.6, linejoin: 'round' });
    if (dash !== undefined) poly.attr('stroke-dasharray', dash);
  } else {
    const heavy = feature.kind === 'fence' || feature.kind === 'wall';
    const line = g.polyline(attr).fill('none').stroke({ color: FEATURE_STROKE, width: heavy ? 1.1 : 0.7, linejoin: 'round' });
    if (feature.kind === 'path') line.attr('stroke-dasharray', '3 1.5');
    if (feature.kind === 'fence') {
      // Posts along a fence, as small ticks every 10 pt.
      for (const c of crossesAlong(feature.points, 10)) g.circle(1.6).attr({ cx: r2(c.x), cy: r2(c.y) }).fill(FEATURE_STROKE);
    }
  }
  return g;
}
