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
  // US Letter 8.5 × 11 in, by default 0.5 in margins → 7.5 × 10 in.
  letter: { short: 8.5, long: 11, margin: 0.5, unit: 'in', ptPerUnit: PT_PER_INCH },
  // ISO 216 A4 210 × 297 mm, by default 12.7 mm margins → 184.6 × 271.6 mm.
  a4: { short: 210, long: 297, margin: 12.7, unit: 'mm', ptPerUnit: PT_PER_MM },
} as const;

/** Margins as totals across and down the sheet (left + right, top + bottom), pt. */
export interface SheetMargins {
  acrossPt: number;
  downPt: number;
}

/**
 * The drawing's share of a sheet: the sheet less its margins (by default 0.5 in / 12.7 mm on every side;
 * the packet passes its own page margins) and less `headroomPt` kept free above the drawing on its page (a
 * section heading and a caption), so that the drawing prints at 100 % — its stated scale true — instead
 * of being shrunk to fit the page.
 */
export function printableArea(paper: PaperSize, orientation: Orientation, headroomPt = 0, margins?: SheetMargins): PrintableArea {
  const sheet = SHEETS[paper];
  const across = (margins?.acrossPt ?? 2 * sheet.margin * sheet.ptPerUnit) + 0;
  const down = (margins?.downPt ?? 2 * sheet.margin * sheet.ptPerUnit) + headroomPt;
  const round = (v: number) => Math.round(v * 100) / 100;
  const w = round((orientation === 'portrait' ? sheet.short : sheet.long) - across / sheet.ptPerUnit);
  const h = round((orientation === 'portrait' ? sheet.long : sheet.short) - down / sheet.ptPerUnit);
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
  /** As the title block writes it: `1:200`, or `1 in = 20 ft` (engineer's) / `1/8 in = 1 ft` (architect's). */
  label: string;
}

/**
 * ISO 5455 recommended reductions (1:20, 1:50, 1:100, 1:200, 1:500 …) with the intermediate steps of a
 * metric triangular scale rule (1:25, 1:75, 1:125, 1:150, 1:250, 1:300, 1:750, 1:1250, 1:2500): the
 * intermediate steps are common practice (no published source), listed from memory.
 */
export const METRIC_SCALES: readonly DrawingScale[] = [20, 25, 50, 75, 100, 125, 150, 200, 250, 300, 500, 750, 1000, 1250, 2000, 2500, 5000, 10_000].map(
  (ratio) => ({ ratio, label: `1:${ratio}` }),
);

/**
 * U.S. architect's scales (a fraction of an inch of paper per foot: 1/8 in = 1 ft is 1:96, 12 × 8) and
 * engineer's scales (1 in = N ft: 1 in = 20 ft is 1:240, 20 × 12), ordered by ratio. The sides of the
 * architect's and civil engineer's triangular scale rules, from memory. Written in the one style of
 * feet and inches the packet uses (`1/8 in = 1 ft`), not the drafter's `1/8" = 1'-0"`.
 */
const ARCHITECT_INCHES_PER_FOOT: readonly [number, string][] = [
  [1 / 2, '1/2'],
  [3 / 8, '3/8'],
  [1 / 4, '1/4'],
  [3 / 16, '3/16'],
  [1 / 8, '1/8'],
  [3 / 32, '3/32'],
  [1 / 16, '1/16'],
  [1 / 32, '1/32'],
];
const ENGINEER_FEET_PER_INCH = [10, 20, 30, 40, 50, 60, 100, 200, 300, 400, 500, 600, 1000];
export const IMPERIAL_SCALES: readonly DrawingScale[] = [
  ...ARCHITECT_INCHES_PER_FOOT.map(([inches, text]) => ({ ratio: Math.round(12 / inches), label: `${text} in = 1 ft` })),
  ...ENGINEER_FEET_PER_INCH.map((feet) => ({ ratio: feet * 12, label: `1 in = ${feet} ft` })),
].sort((a, b) => a.ratio - b.ratio);

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

/** The scale as printed in the title block, e.g. `1:200` or `1 in = 20 ft (1:240)`. */
export function formatScale(scale: DrawingScale): string {
  return scale.label.startsWith('1:') ? scale.label : `${scale.label} (1:${scale.ratio})`;
}
