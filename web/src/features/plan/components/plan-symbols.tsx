import type { ItemKind } from '@domain/as-built/item.schema';
import { REFERENCE_INK, RUN_ORANGE, RUN_STROKES, scaleDash } from '@drawings/marking-palette';

import type { RunStyle } from '../utils/plan-records';
import { HALO, SELECTION } from '../../../config/canvas-theme';

/**
 * The printed site plan's own symbols (api/src/drawings/site-plan-symbols.ts), drawn in screen pixels
 * at 1.8× so they read on a phone: told apart by shape, not only colour.
 */
const S = 1.8;
const INK = REFERENCE_INK;

type Point = { x: number; y: number };

function pts(points: readonly Point[]): string {
  return points.map((p) => `${p.x.toFixed(1)},${p.y.toFixed(1)}`).join(' ');
}

export function ItemSymbol({ kind, x, y, isSelected = false }: { kind: ItemKind; x: number; y: number; isSelected?: boolean }) {
  const line = { stroke: INK, strokeWidth: 1.4 };
  const halo = isSelected ? <circle cx={x} cy={y} r={15} fill="none" stroke={SELECTION} strokeWidth={3} /> : null;
  switch (kind) {
    case 'amplifier':
      return (
        <g>
          {halo}
          <rect x={x - 6 * S} y={y - 4.5 * S} width={12 * S} height={9 * S} fill={HALO} {...line} />
          <polygon points={pts([{ x: x - 3 * S, y: y - 3 * S }, { x: x + 3.5 * S, y }, { x: x - 3 * S, y: y + 3 * S }])} fill={INK} />
        </g>
      );
    case 'speaker':
      return (
        <g>
          {halo}
          <circle cx={x} cy={y} r={4.5 * S} fill={HALO} {...line} />
          <circle cx={x} cy={y} r={1.8 * S} fill={INK} />
        </g>
      );
    case 'subwoofer':
      return (
        <g>
          {halo}
          <rect x={x - 5 * S} y={y - 5 * S} width={10 * S} height={10 * S} fill={HALO} {...line} />
          <circle cx={x} cy={y} r={3.5 * S} fill="none" {...line} />
          <circle cx={x} cy={y} r={1.2 * S} fill={INK} />
        </g>
      );
    case 'junction':
      return (
        <g>
          {halo}
          <polygon points={pts([{ x, y: y - 5 * S }, { x: x + 5 * S, y }, { x, y: y + 5 * S }, { x: x - 5 * S, y }])} fill={INK} stroke={HALO} strokeWidth={1} />
        </g>
      );
    case 'spare_end':
      return (
        <g>
          {halo}
          <polygon points={pts([{ x: x - 4 * S, y: y - 2 * S }, { x: x + 4 * S, y: y - 2 * S }, { x, y: y + 4.5 * S }])} fill={HALO} {...line} />
          <rect x={x - 5 * S} y={y - 4.8 * S} width={10 * S} height={2 * S} fill={INK} />
        </g>
      );
    case 'wall_entry':
      return (
        <g>
          {halo}
          <rect x={x - 4.5 * S} y={y - 4.5 * S} width={9 * S} height={9 * S} fill={HALO} {...line} />
          <polygon points={pts([{ x: x - 4.5 * S, y: y - 4.5 * S }, { x: x - 4.5 * S, y: y + 4.5 * S }, { x: x + 4.5 * S, y: y + 4.5 * S }])} fill={INK} />
        </g>
      );
  }
}

/** A survey-style reference point: a ring with a cross through it. */
export function ReferenceSymbol({ x, y, isSelected = false }: { x: number; y: number; isSelected?: boolean }) {
  return (
    <g>
      {isSelected && <circle cx={x} cy={y} r={15} fill="none" stroke={SELECTION} strokeWidth={3} />}
      <circle cx={x} cy={y} r={3.5 * S} fill={HALO} stroke={INK} strokeWidth={1.3} />
      <line x1={x - 6 * S} y1={y} x2={x + 6 * S} y2={y} stroke={INK} strokeWidth={1.3} />
      <line x1={x} y1={y - 6 * S} x2={x} y2={y + 6 * S} stroke={INK} strokeWidth={1.3} />
    </g>
  );
}

/** The palette's run orange (APWA uniform colour code: communication / signal cable), as in print. */
export const CABLE_ORANGE = RUN_ORANGE;

/** Screen pixels per print point for run strokes: as the symbols, so lines read on a phone. */
const RUN_SCALE = 1.9;

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

/**
 * A run as in print (marking-palette.ts): always orange; weight and dash pattern tell direct burial,
 * conduit, sleeve, indoor, spare, abandoned (with crosses) and a route not recorded (dots) apart.
 * `scale` multiplies the screen weight (e.g. a highlighted run).
 */
export function RunLine({ style, points, isRouteRecorded, scale = 1 }: { style: RunStyle; points: readonly Point[]; isRouteRecorded: boolean; scale?: number }) {
  const spec = isRouteRecorded ? RUN_STROKES[style] : RUN_STROKES.route_not_recorded;
  const factor = RUN_SCALE * scale;
  const width = Math.max(spec.width * factor, 1.5);
  const crosses = isRouteRecorded && spec.crossesEvery !== undefined ? crossesAlong(points, spec.crossesEvery * RUN_SCALE * 1.5) : [];
  return (
    <g data-style={isRouteRecorded ? style : 'route_not_recorded'}>
      <polyline
        points={pts(points)}
        fill="none"
        stroke={spec.color}
        strokeWidth={width}
        strokeDasharray={scaleDash(spec.dash, factor)}
        strokeLinecap={spec.linecap}
        strokeLinejoin="round"
        data-role="run-stroke"
      />
      {crosses.map((c, i) => (
        <path
          key={i}
          d={`M${c.x - 4} ${c.y - 4}L${c.x + 4} ${c.y + 4}M${c.x - 4} ${c.y + 4}L${c.x + 4} ${c.y - 4}`}
          fill="none"
          stroke={spec.color}
          strokeWidth={width}
          data-role="run-stroke"
        />
      ))}
    </g>
  );
}
