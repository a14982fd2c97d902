import type { UnitSystem } from './drawing-units.js';

export type PaperSize = 'letter' | 'a4';
export type Orientation = 'portrait' | 'landscape';

export const PT_PER_INCH = 72;
export const PT_PER_MM = 72 / 25.4;
/** Paper points per metre of paper (72 pt = 1 in = 0.0254 m). */
export const PT_PER_PAPER_METRE = PT_PER_INCH / 0.0254;

/**
 * The printable area a drawing occupies: the sheet minus 0.5 in (Letter) or 12.7 mm (A4) margins on
 * every side. `widthAttr`/`heightAttr` are the SVG `width`/`height` in the sheet's own unit.
 */
export interface PrintableArea {
  paper: PaperSize;
  orientation: Orientation;
  widthPt: number;
  heightPt: number;
  widthAttr: string;
  heightAttr: string;
}

const SHEETS = {
  // US Letter 8.5 × 11 in, 0.5 in margins → 7.5 × 10 in.
  letter: { short: 7.5, long: 10, unit: 'in', ptPerUnit: PT_PER_INCH },
  // ISO 216 A4 210 × 297 mm, 12.7 mm margins → 184.6 × 271.6 mm.
  a4: { short: 184.6, long: 271.6, unit: 'mm', ptPerUnit: PT_PER_MM },
} as const;

export function printableArea(paper: PaperSize, orientation: Orientation): PrintableArea {
  const sheet = SHEETS[paper];
  const w = orientation === 'portrait' ? sheet.short : sheet.long;
  const h = orientation === 'portrait' ? sheet.long : sheet.short;
  return {
    paper,
    orientation,
    widthPt: w * sheet.ptPerUnit,
    heightPt: h * sheet.ptPerUnit,
    widthAttr: `${w}${sheet.unit}`,
    heightAttr: `${h}${sheet.unit}`,
  };
}

export function paperName(paper: PaperSize): string {
  return paper === 'letter' ? 'Letter' : 'A4';
}

/** A standard drawing scale: 1 unit on paper = `ratio` units on the ground. */
export interface DrawingScale {
  ratio: number;
  /** As drafters write it: `1:200`, or `1" = 20'` (imperial engineering) / `1/8" = 1'-0"` (architectural). */
  label: string;
}

/** ISO 5455 recommended reductions plus the 1:25 / 1:250 / 1:1250 / 1:2500 steps common on site plans. */
export const METRIC_SCALES: readonly DrawingScale[] = [20, 25, 50, 100, 200, 250, 500, 1000, 1250, 2000, 2500, 5000, 10_000].map(
  (ratio) => ({ ratio, label: `1:${ratio}` }),
);

/**
 * U.S. architectural (fraction of an inch per foot) and civil-engineer (1 in = N ft) scales, ordered by
 * ratio. 1/8" = 1'-0" is 1:96 (12 × 8); 1" = 20' is 1:240 (20 × 12).
 */
export const IMPERIAL_SCALES: readonly DrawingScale[] = [
  { ratio: 24, label: `1/2" = 1'-0"` },
  { ratio: 48, label: `1/4" = 1'-0"` },
  { ratio: 96, label: `1/8" = 1'-0"` },
  { ratio: 120, label: `1" = 10'` },
  { ratio: 192, label: `1/16" = 1'-0"` },
  { ratio: 240, label: `1" = 20'` },
  { ratio: 360, label: `1" = 30'` },
  { ratio: 480, label: `1" = 40'` },
  { ratio: 600, label: `1" = 50'` },
  { ratio: 720, label: `1" = 60'` },
  { ratio: 1200, label: `1" = 100'` },
  { ratio: 2400, label: `1" = 200'` },
  { ratio: 6000, label: `1" = 500'` },
  { ratio: 12_000, label: `1" = 1000'` },
];

/** Paper points per plan metre at a scale of 1:`ratio`. */
export function ptPerPlanMetre(ratio: number): number {
  return PT_PER_PAPER_METRE / ratio;
}

/**
 * The largest standard scale (smallest ratio) at which a plan extent of `extentWM` × `extentHM` metres
 * fits in `availWPt` × `availHPt` paper points; null when it does not fit even the smallest scale in the
 * list (the plan is then drawn "not to scale").
 */
export function chooseScale(
  extentWM: number,
  extentHM: number,
  availWPt: number,
  availHPt: number,
  units: UnitSystem,
): DrawingScale | null {
  const scales = units === 'metric' ? METRIC_SCALES : IMPERIAL_SCALES;
  for (const scale of scales) {
    const k = ptPerPlanMetre(scale.ratio);
    if (extentWM * k <= availWPt + 1e-9 && extentHM * k <= availHPt + 1e-9) return scale;
  }
  return null;
}

/** The scale as printed in the title block, e.g. `1:200` or `1" = 20' (1:240)`. */
export function formatScale(scale: DrawingScale): string {
  return scale.label.startsWith('1:') ? scale.label : `${scale.label} (1:${scale.ratio})`;
}
