import { fileURLToPath } from 'node:url';

import * as fontkit from 'fontkit';
import { describe, expect, it } from 'vitest';

import { analyzeAsBuilt } from '../domain/analysis/analyze.js';
import { DEMO_AS_BUILT } from '../domain/as-built/demo-as-built.js';
import { layoutSitePlan } from './site-plan-layout.js';
import { LABEL_PAD_PT, textWidth, type FontFace } from './text-box.js';

// The shipped font, laid out by fontkit (glyph advances and kerning, as Chromium prints it).
const FACE_FILES: Record<FontFace, string> = { regular: '400-normal', bold: '700-normal', italic: '400-italic' };
const fonts = Object.fromEntries(
  Object.entries(FACE_FILES).map(([face, file]) => [
    face,
    ['latin', 'latin-ext', 'greek'].map((subset) => fontkit.openSync(fileURLToPath(new URL(`../../../fonts/inter-static/inter-${subset}-${file}.woff2`, import.meta.url)))),
  ]),
) as Record<FontFace, fontkit.Font[]>;

/** Width of `text` at `size` pt in the shipped Inter face, by fontkit (each character from the subset that has it). */
function fontkitWidth(text: string, size: number, face: FontFace): number {
  let width = 0;
  // Runs of characters from the same subset file, laid out together so that kerning applies within them.
  let run = '';
  let runFont: fontkit.Font | undefined;
  const flush = () => {
    if (runFont && run) width += (runFont.layout(run).advanceWidth * size) / runFont.unitsPerEm;
    run = '';
  };
  for (const ch of text) {
    const font = fonts[face].find((f) => f.hasGlyphForCodePoint(ch.codePointAt(0)!)) ?? fonts[face][0]!;
    if (font !== runFont) {
      flush();
      runFont = font;
    }
    run += ch;
  }
  flush();
  return width;
}

describe(textWidth.name, () => {
  it.each([
    ['Patio splice to P2', 7, 'bold'],
    ['14 AWG · min depth 4 3/8 in (SHALLOW)', 6.5, 'regular'],
    ['Corner of the house', 6.5, 'italic'],
    ['26 ft 3 in', 6, 'regular'],
    ['5.33 Ω · 2.5 mm² (≈ 13 AWG) — Ærøskøbing', 7, 'regular'],
    ['WAVY AVENUE Tý', 8, 'bold'],
  ] as const)('should measure %j at %d pt (%s) as the shipped font does, never narrower', (text, size, face) => {
    const measured = textWidth(text, size, face);
    const actual = fontkitWidth(text, size, face);
    // Kerning is left out of the table: it errs wide (a run of capitals such as "AVENUE" by a few per cent).
    expect(measured).toBeGreaterThanOrEqual(actual - 0.01);
    expect(measured).toBeLessThanOrEqual(actual * 1.06 + 0.01);
  });
});

describe('site plan label boxes', () => {
  it('should hold each label line as wide as the shipped font prints it (demo job, both sheets)', () => {
    const analysis = analyzeAsBuilt(DEMO_AS_BUILT);
    for (const sheet of ['plan', 'ties'] as const) {
      const model = layoutSitePlan(DEMO_AS_BUILT, analysis, { sheet });
      for (const label of model.labels) {
        label.lines.forEach((line, i) => {
          const face: FontFace = label.kind === 'reference' || label.kind === 'feature' ? 'italic' : label.kind === 'item' || (label.kind === 'run' && i === 0) ? 'bold' : 'regular';
          expect(fontkitWidth(line, label.fontSize, face), `${label.id}: ${line}`).toBeLessThanOrEqual(label.box.width - 2 * LABEL_PAD_PT + 0.01);
        });
      }
    }
  });
});
