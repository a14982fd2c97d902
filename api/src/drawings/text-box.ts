/**
 * Text size estimates, without a font engine (svgdom cannot measure text, and the server must not
 * depend on installed fonts). Inter's average advance is about 0.5 em for lower case, 0.6 em for digits
 * and 0.7 em for capitals; 0.6 em per character over-estimates mixed text slightly, which errs on the
 * side of space between labels.
 */
export const CHAR_WIDTH_EM = 0.6;
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

export function textWidth(text: string, fontSize: number): number {
  return [...text].length * fontSize * CHAR_WIDTH_EM;
}

/** Size of a label box of one or more lines, padding included. */
export function labelSize(lines: readonly string[], fontSize: number): { width: number; height: number } {
  const widest = Math.max(0, ...lines.map((line) => textWidth(line, fontSize)));
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
