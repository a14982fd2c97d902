import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';

import Handlebars from 'handlebars';

import type { LocateViewResponse } from '../domain/locate/locate-link.schema.js';
import { buildLocateSheetViewModel } from '../domain/locate/locate-sheet.view-model.js';
import { drawLocateSheetMap } from '../drawings/locate-sheet-map.js';
import { printFontFaceCss } from '../packets/packet-document.js';

/** templates/locate-sheet at the repository root (the same relative path from api/src and api/dist). */
const TEMPLATE_DIR = fileURLToPath(new URL('../../../templates/locate-sheet', import.meta.url));

let compiled: { template: Handlebars.TemplateDelegate; css: string } | undefined;

function assets() {
  if (!compiled) {
    compiled = {
      template: Handlebars.create().compile(readFileSync(join(TEMPLATE_DIR, 'locate-sheet.html.hbs'), 'utf8'), { strict: false }),
      css: readFileSync(join(TEMPLATE_DIR, 'locate-sheet.css'), 'utf8'),
    };
  }
  return compiled;
}

/** Map box on the sheet, print points (the page's width less margins; the height the lists leave scales it down). */
const MAP_BOX = { letter: { widthPt: 547, heightPt: 400 }, a4: { widthPt: 530, heightPt: 420 } } as const;

/** Characters our texts use that the shipped Inter subsets lack (they would print in a fallback font). */
const OUTSIDE_FONT: Record<string, string> = { '≤': '&lt;=', '≥': '&gt;=', '→': '-&gt;', '⚠': '!' };

/**
 * The one-page locate sheet's HTML: the locate view's data through a pure view model, the map drawn as
 * SVG, the shipped fonts inline. Handlebars escapes every value; only our CSS, fonts and SVG go in raw.
 */
export function renderLocateSheetHtml(view: LocateViewResponse, paper: 'letter' | 'a4'): string {
  const { template, css } = assets();
  const vm = buildLocateSheetViewModel(view, paper);
  const mapSvg = drawLocateSheetMap(view.map, { ...MAP_BOX[paper], units: view.units });
  return template({ vm, css, fontFaceCss: printFontFaceCss(), mapSvg }).replace(/[≤≥→⚠]/g, (c) => OUTSIDE_FONT[c] ?? c);
}
