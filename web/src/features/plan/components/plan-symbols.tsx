import type { ItemKind } from '@domain/as-built/item.schema';

import type { RunStyle } from '../utils/plan-records';

/**
 * The printed site plan's own symbols (api/src/drawings/site-plan-symbols.ts), drawn in screen pixels
 * at 1.8× so they read on a phone: told apart by shape, not only colour.
 */
const S = 1.8;
const INK = '#1b1b1b';

type Point = { x: number; y: number };

function pts(points: readonly Point[]): string {
  return points.map((p) => `${p.x.toFixed(1)},${p.y.toFixed(1)}`).join(' ');
}

export function ItemSymbol({ kind, x, y, isSelected = false }: { kind: ItemKind; x: number; y: number; isSelected?: boolean }) {
  const line = { stroke: INK, strokeWidth: 1.4 };
  const halo = isSelected ? <circle cx={x} cy={y} r={15} fill="none" stroke="#0f6cbd" strokeWidth={3} /> : null;
  switch (kind) {
    case 'amplifier':
      return (
        <g>
          {halo}
          <rect x={x - 6 * S} y={y - 4.5 * S} width={12 * S} height={9 * S} fill="#fff" {...line} />
          <polygon points={pts([{ x: x - 3 * S, y: y - 3 * S }, { x: x + 3.5 * S, y }, { x: x - 3 * S, y: y + 3 * S }])} fill={INK} />
        </g>
      );
    case 'speaker':
      return (
        <g>
          {halo}
          <circle cx={x} cy={y} r={4.5 * S} fill="#fff" {...line} />
          <circle cx={x} cy={y} r={1.8 * S} fill={INK} />
        </g>
      );
    case 'subwoofer':
      return (
        <g>
          {halo}
          <rect x={x - 5 * S} y={y - 5 * S} width={10 * S} height={10 * S} fill="#fff" {...line} />
          <circle cx={x} cy={y} r={3.5 * S} fill="none" {...line} />
          <circle cx={x} cy={y} r={1.2 * S} fill={INK} />
        </g>
      );
    case 'junction':
      return (
        <g>
          {halo}
          <polygon points={pts([{ x, y: y - 5 * S }, { x: x + 5 * S, y }, { x, y: y + 5 * S }, { x: x - 5 * S, y }])} fill={INK} stroke="#fff" strokeWidth={1} />
        </g>
      );
    case 'spare_end':
      return (
        <g>
          {halo}
          <polygon points={pts([{ x: x - 4 * S, y: y - 2 * S }, { x: x + 4 * S, y: y - 2 * S }, { x, y: y + 4.5 * S }])} fill="#fff" {...line} />
          <rect x={x - 5 * S} y={y - 4.8 * S} width={10 * S} height={2 * S} fill={INK} />
        </g>
      );
    case 'wall_entry':
      return (
        <g>
          {halo}
          <rect x={x - 4.5 * S} y={y - 4.5 * S} width={9 * S} height={9 * S} fill="#fff" {...line} />
          <polygon points={pts([{ x: x - 4.5 * S, y: y - 4.5 * S }, { x: x - 4.5 * S, y: y + 4.5 * S }, { x: x + 4.5 * S, y: y + 4.5 * S }])} fill={INK} />
        </g>
      );
  }
}

/** A survey-style reference point: a ring with a cross through it. */
export function ReferenceSymbol({ x, y, isSelected = false }: { x: number; y: number; isSelected?: boolean }) {
  return (
    <g>
      {isSelected && <circle cx={x} cy={y} r={15} fill="none" stroke="#0f6cbd" strokeWidth={3} />}
      <circle cx={x} cy={y} r={3.5 * S} fill="#fff" stroke={INK} strokeWidth={1.3} />
      <line x1={x - 6 * S} y1={y} x2={x + 6 * S} y2={y} stroke={INK} strokeWidth={1.3} />
      <line x1={x} y1={y - 6 * S} x2={x} y2={y + 6 * S} stroke={INK} strokeWidth={1.3} />
    </g>
  );
}

/** Utility-marking orange (APWA uniform colour code: communications / signal cable), as in print. */
export const CABLE_ORANGE = '#d35400';
const GREY = '#6b6b6b';

/** A run as stacked strokes: line style, not only colour, tells the kinds apart (as in print). */
export function RunLine({ style, points, isRouteRecorded }: { style: RunStyle; points: readonly Point[]; isRouteRecorded: boolean }) {
  const attr = pts(points);
  const stroke = (color: string, width: number, dash?: string, key?: string) => (
    <polyline key={key ?? `${color}-${width}`} points={attr} fill="none" stroke={color} strokeWidth={width} strokeDasharray={dash} strokeLinejoin="round" />
  );
  if (!isRouteRecorded) {
    return <g>{stroke(style === 'abandoned' || style === 'indoor' ? GREY : CABLE_ORANGE, 2, '2 4')}</g>;
  }
  switch (style) {
    case 'direct_burial':
      return <g>{stroke(CABLE_ORANGE, 3)}</g>;
    case 'conduit':
      return <g>{[stroke(CABLE_ORANGE, 6.5, undefined, 'a'), stroke('#fff', 3, undefined, 'b')]}</g>;
    case 'under_hardscape_sleeve':
      return <g>{[stroke(CABLE_ORANGE, 7.5, undefined, 'a'), stroke('#fff', 4.3, undefined, 'b'), stroke(CABLE_ORANGE, 1.5, '2.7 2.7', 'c')]}</g>;
    case 'indoor':
      return <g>{stroke(GREY, 1.8, '10 4 3 4')}</g>;
    case 'spare':
      return <g>{stroke(CABLE_ORANGE, 2.6, '12 5')}</g>;
    case 'abandoned':
      return <g>{stroke(GREY, 1.5, '3 3')}</g>;
  }
}
