import { INTER_ADVANCES, INTER_UNITS_PER_EM } from './font-metrics.generated.js';

/**
 * Text is measured with the advance widths of the shipped Inter faces (font-metrics.generated.ts, made
 * from fonts/inter-static with fontkit by scripts/generate-font-metrics.mjs), so a label box is as wide
 * as the text Chromium prints in it — in the browser and on the server alike (svgdom cannot measure
 * text, and the server must not depend on installed fonts). Kerning is left out: Inter's pairs mostly
 * tighten text, and the few that widen it are covered by {@link KERNING_ALLOWANCE_EM} per character, so
 * the measure errs on the side of space. A character outside the table counts as {@link CHAR_WIDTH_EM}.
 */
export const CHAR_WIDTH_EM = 0.6;
/** Added per character for the kerning pairs that widen text (Inter's are well under 0.005 em). */
export const KERNING_ALLOWANCE_EM = 0.005;
/** Line height as a multiple of the font size. */
export const LINE_HEIGHT_EM = 1.2;
/** Distance from the top of a line box to its baseline, as a multiple of the font size. */
export const BASELINE_EM = 0.9;
/** Padding around a label's text inside its box, pt. */
export const LABEL_PAD_PT = 1;

export interface Box {
  x: number;
  y: number;
  width: number;
  height: number;
}

export interface Point {
  x: number;
  y: number;
}

/** The Inter face a line is printed in (`font-weight: bold` prints the 700 face). */
export type FontFace = 'regular' | 'bold' | 'italic';

const advanceTables = new Map<FontFace, Map<number, number>>();

function advances(face: FontFace): Map<number, number> {
  let table = advanceTables.get(face);
  if (table === undefined) {
    table = new Map();
    for (const [first, ...widths] of INTER_ADVANCES[face]) widths.forEach((w, i) => table!.set(first! + i, w / INTER_UNITS_PER_EM));
    advanceTables.set(face, table);
  }
  return table;
}

/** Width of one line of text in points, from the shipped font's advance widths. */
export function textWidth(text: string, fontSize: number, face: FontFace = 'regular'): number {
  const table = advances(face);
  let em = 0;
  for (const ch of text) em += (table.get(ch.codePointAt(0)!) ?? CHAR_WIDTH_EM) + KERNING_ALLOWANCE_EM;
  return em * fontSize;
}

/** Size of a label box of one or more lines, padding included; `faceOf` gives each line's face (default regular). */
export function labelSize(
  lines: readonly string[],
  fontSize: number,
  faceOf: (lineIndex: number) => FontFace = () => 'regular',
): { width: number; height: number } {
  const widest = Math.max(0, ...lines.map((line, i) => textWidth(line, fontSize, faceOf(i))));
  return { width: widest + 2 * LABEL_PAD_PT, height: lines.length * fontSize * LINE_HEIGHT_EM + 2 * LABEL_PAD_PT };
}

/** True when two boxes overlap by more than `gap` (touching edges do not count). */
export function boxesIntersect(a: Box, b: Box, gap = 0): boolean {
  return a.x < b.x + b.width + gap && b.x < a.x + a.width + gap && a.y < b.y + b.height + gap && b.y < a.y + a.height + gap;
}

export function boxContains(outer: Box, inner: Box): boolean {
  return inner.x >= outer.x && inner.y >= outer.y && inner.x + inner.width <= outer.x + outer.width && inner.y + inner.height <= outer.y + outer.height;
}

/** Splits text into lines of at most `maxChars` characters at spaces (a longer word gets its own line). */
export function wrapText(text: string, maxChars: number): string[] {
  const lines: string[] = [];
  let line = '';
  for (const word of text.split(/\s+/).filter((w) => w.length > 0)) {
    if (line.length === 0) line = word;
    else if (line.length + 1 + word.length <= maxChars) line += ` ${word}`;
    else {
      lines.push(line);
      line = word;
    }
  }
  if (line.length > 0) lines.push(line);
  return lines;
}
