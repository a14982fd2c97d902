import { randomUUID } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';

import Handlebars from 'handlebars';
import QRCode from 'qrcode';

import { buildPacketViewModel, type PacketViewModel, type PacketViewModelInput } from '../domain/packet/packet.view-model.js';
import type { PacketSnapshot } from '../domain/packet/packet-snapshot.js';
import { runProvenanceLines } from '../domain/packet/plan-provenance.js';
import type { PlanImage } from '../drawings/drawing-options.js';
import type { Orientation } from '../drawings/paper.js';
import { drawJobDepthProfile, drawJobSchematic, drawJobSitePlan, jobTitleBlock } from '../drawings/job-drawings.js';
import { colourKeyNote, RUN_ORANGE } from '../drawings/marking-palette.js';
import { createNodeSvgCanvas } from '../drawings/node-svg-window.js';
import { type ChromiumPrinter, type LoadedPage, type PageEdit } from './chromium-printer.js';
import { readPdfFacts, readPdfLayout, withDocumentInfo } from './pdf-document-info.js';

/**
 * templates/packet and fonts/inter-static at the repository root (the same relative path from api/src
 * and api/dist). The packet uses Inter's static weights, not the variable font the web app loads:
 * Chromium embeds a variable font in a PDF as Type 3 glyphs, which misplaces some glyphs (the hyphen)
 * and hides the font from PDF tools; static faces embed as ordinary TrueType subsets.
 */
export const PACKET_TEMPLATE_DIR = fileURLToPath(new URL('../../../templates/packet', import.meta.url));
export const PACKET_FONTS_DIR = fileURLToPath(new URL('../../../fonts/inter-static', import.meta.url));

/** The weights the print CSS and the drawings use. */
const FONT_WEIGHTS = [400, 500, 600, 700] as const;

/** The Inter subsets and their unicode ranges (as in fonts/README.md and web/src/fonts.css). */
const FONT_SUBSETS = [
  {
    subset: 'latin',
    range:
      'U+0000-00FF, U+0131, U+0152-0153, U+02BB-02BC, U+02C6, U+02DA, U+02DC, U+0304, U+0308, U+0329, U+2000-206F, U+20AC, U+2122, U+2191, U+2193, U+2212, U+2215, U+FEFF, U+FFFD',
  },
  {
    subset: 'latin-ext',
    range:
      'U+0100-02BA, U+02BD-02C5, U+02C7-02CC, U+02CE-02D7, U+02DD-02FF, U+0304, U+0308, U+0329, U+1D00-1DBF, U+1E00-1E9F, U+1EF2-1EFF, U+2020, U+20A0-20AB, U+20AD-20C0, U+2113, U+2C60-2C7F, U+A720-A7FF',
  },
  { subset: 'greek', range: 'U+0370-0377, U+037A-037F, U+0384-038A, U+038C, U+038E-03A1, U+03A3-03FF' },
] as const;

export interface PacketDrawings {
  sitePlan: string;
  /** The ties sheet (reference points, items, tie distances); empty when nothing was tied. */
  ties: string;
  schematic: string;
  /** Which way each drawing's page is turned (the drawing chose the orientation that prints it larger). */
  orientation?: { sitePlan: Orientation; ties: Orientation; schematic: Orientation };
  profiles: { runId: string; label: string; caption: string; svg: string }[];
}

interface PacketAssets {
  fontFaceCss: string;
  footerFontFaceCss: string;
  printCss: string;
  template: Handlebars.TemplateDelegate;
}

let assets: PacketAssets | undefined;

/**
 * Fonts (inlined as data URIs: the page may load nothing but data:), the print CSS and the compiled
 * template, read once per process. Handlebars escapes every `{{value}}`; only our own markup (the CSS,
 * fonts, the drawings' SVG and the QR code) is inserted raw with `{{{ }}}`.
 */
function loadAssets(): PacketAssets {
  if (!assets) {
    const face = (subset: string, range: string, weight: number, style: 'normal' | 'italic') => {
      const data = readFileSync(join(PACKET_FONTS_DIR, `inter-${subset}-${weight}-${style}.woff2`)).toString('base64');
      return `@font-face{font-family:'Inter';font-style:${style};font-weight:${weight};font-display:block;src:url(data:font/woff2;base64,${data}) format('woff2');unicode-range:${range};}`;
    };
    // Italic only at 400: the drawings set reference-point labels and notes in italic (a synthesised
    // slant would be embedded as Type 3 glyphs).
    const faces = FONT_SUBSETS.flatMap(({ subset, range }) => [
      ...FONT_WEIGHTS.map((weight) => face(subset, range, weight, 'normal')),
      face(subset, range, 400, 'italic'),
    ]);
    const handlebars = Handlebars.create();
    assets = {
      fontFaceCss: faces.join('\n'),
      // The footer is printed in its own document: it needs its own copy of the font (Latin regular suffices).
      footerFontFaceCss: faces[0]!,
      printCss: readFileSync(join(PACKET_TEMPLATE_DIR, 'print.css'), 'utf8'),
      template: handlebars.compile(readFileSync(join(PACKET_TEMPLATE_DIR, 'packet.html.hbs'), 'utf8'), { strict: false }),
    };
  }
  return assets;
}

/** The shipped Inter faces as inline @font-face rules (data: URIs), for other printed pages (the locate sheet). */
export function printFontFaceCss(): string {
  return loadAssets().fontFaceCss;
}

/** Margins of the packet's drawing pages (print.css `@page drawing-*`): 0.5 in, 0.75 in at the foot for the footer. */
const DRAWING_PAGE_MARGINS = { acrossPt: 72, downPt: 90 };
/** The section heading and the caption under the site plan and ties sheet, pt (print.css h2.section-title, .caption). */
const PLAN_HEADROOM_PT = 70;
/** The section heading above the schematic, pt. */
const SCHEMATIC_HEADROOM_PT = 44;

function orientationOf(svg: string): Orientation {
  const match = /^<svg[^>]*\swidth="([\d.]+)(in|mm)"[^>]*\sheight="([\d.]+)(in|mm)"/.exec(svg);
  return match && Number(match[1]) > Number(match[3]) ? 'landscape' : 'portrait';
}

/**
 * The three kinds of drawing of the snapshot's as-built, in the packet's units and paper, through the
 * same functions as the drawing routes and the web app (drawings/job-drawings.ts). `planImage` is the
 * site's calibrated plan image, drawn under the site plan when the site has one.
 */
export async function drawPacketDrawings(
  snapshot: PacketSnapshot,
  vm: PacketViewModel,
  planImage?: PlanImage,
  options: { withProfiles?: boolean } = {},
): Promise<PacketDrawings> {
  const input = drawingInput(snapshot);
  const titleBlock = jobTitleBlock({
    jobTitle: snapshot.job.title,
    siteLabel: snapshot.site.label,
    place: snapshot.site.addressLine1,
    revision: snapshot.revision,
    date: vm.cover.issuedDate,
    preparedBy: snapshot.company.name,
  });
  const paper = snapshot.settings.paperSize;
  // Each drawing is sized to the page it prints on (the drawing pages' margins, less the heading and
  // caption), so it prints at 100 % and the scale in its title block is true.
  const plan = { paper, orientation: 'auto' as const, margins: DRAWING_PAGE_MARGINS, headroomPt: PLAN_HEADROOM_PT, titleBlock };
  const hasTies = vm.ties.rows.length > 0;
  // Per run: when it went in and by which job, since when abandoned (the site record, issue 21).
  const runProvenance = runProvenanceLines(snapshot.siteRecords, { timeZone: snapshot.settings.timeZone ?? null, locale: snapshot.settings.locale ?? null });
  const sitePlan = drawJobSitePlan(input, { ...plan, layersOff: ['reference-points'], runProvenance, ...(planImage ? { planImage } : {}) });
  const ties = hasTies ? drawJobSitePlan(input, { ...plan, sheet: 'ties' }) : '';
  // Let pending I/O (a draft print in flight) go on between the site plan sheets and the schematic.
  await new Promise((resolve) => setImmediate(resolve));
  const schematic = await drawJobSchematic(input, {
    paper,
    orientation: 'auto',
    margins: DRAWING_PAGE_MARGINS,
    headroomPt: SCHEMATIC_HEADROOM_PT,
    showFindings: false,
  });
  return {
    sitePlan,
    ties,
    schematic,
    orientation: { sitePlan: orientationOf(sitePlan), ties: orientationOf(ties), schematic: orientationOf(schematic) },
    profiles: options.withProfiles === false ? [] : drawPacketProfiles(snapshot, vm),
  };
}

function drawingInput(snapshot: PacketSnapshot) {
  return {
    asBuilt: snapshot.asBuilt,
    analysis: snapshot.analysis,
    createCanvas: createNodeSvgCanvas,
    units: snapshot.settings.units,
    locale: snapshot.settings.locale ?? null,
  };
}

/** The depth profile of each run that has readings, in the packet's units. */
export function drawPacketProfiles(snapshot: PacketSnapshot, vm: PacketViewModel): PacketDrawings['profiles'] {
  const input = drawingInput(snapshot);
  return vm.cables.profileRunIds.map((p) => ({ ...p, svg: drawJobDepthProfile(input, p.runId) }));
}

export function qrCodeSvg(url: string): Promise<string> {
  return QRCode.toString(url, { type: 'svg', margin: 0, errorCorrectionLevel: 'M', color: { dark: '#000000', light: '#ffffff' } });
}

/** Photos may only be inline images; anything else would be a request the sandbox refuses anyway. */
const INLINE_IMAGE = /^data:image\/(jpeg|png|webp);base64,[A-Za-z0-9+/=]+$/;

export interface PacketHtmlParts {
  vm: PacketViewModel;
  drawings: PacketDrawings;
  qrSvg: string;
  logoDataUri?: string;
  /** The company's locale: the colour sentence is spelled for it (en-US "color" when absent). */
  locale?: string | null;
}

/**
 * Characters that occur in our own texts and drawings but lie outside the shipped Inter subsets; printed
 * as-is they would fall back to a system font. Replaced in the final (already escaped) HTML.
 */
const OUTSIDE_FONT: Record<string, string> = { '≤': '&lt;=', '≥': '&gt;=', '√': 'sqrt', '→': '-&gt;' };

export function renderPacketHtml(parts: PacketHtmlParts): string {
  const a = loadAssets();
  const photos = parts.vm.photos.filter((p) => INLINE_IMAGE.test(p.dataUri));
  // The photos' data URIs (megabytes) go in after the template: Handlebars builds its output by
  // concatenation and escapes each value with a regular expression, and with them inside the packet
  // took about twice as long (on the way to the final page's load). Each stands in as a token no text
  // can spell (a fresh nonce), replaced by its URI as Handlebars escapes it: of the characters an inline
  // image's URI may have (INLINE_IMAGE), Handlebars escapes only "=".
  const nonce = randomUUID().replaceAll('-', '');
  const vm = { ...parts.vm, photos: photos.map((p, i) => ({ ...p, dataUri: `data:image/jpeg;base64,${nonce}${i}x` })) };
  return printableHtml(renderTemplate(a, vm, parts)).replace(new RegExp(`data:image/jpeg;base64,${nonce}(\\d+)x`, 'g'), (_token, i: string) =>
    photos[Number(i)]!.dataUri.replaceAll('=', '&#x3D;'),
  );
}

/** Escaped HTML (the packet's, or a part of it) with the characters outside the fonts spelled out. */
function printableHtml(html: string): string {
  return html.replace(/[≤≥√→]/g, (c) => OUTSIDE_FONT[c] ?? c);
}

function renderTemplate(a: PacketAssets, vm: PacketViewModel, parts: PacketHtmlParts): string {
  return a.template({
    vm,
    drawings: parts.drawings,
    // The palette's run orange and colour sentence (APWA uniform colour code, via CGA Best Practices).
    marking: { run: RUN_ORANGE, colourKey: colourKeyNote(parts.locale) },
    assets: {
      fontFaceCss: a.fontFaceCss,
      printCss: a.printCss,
      qrSvg: parts.qrSvg,
      logoDataUri: parts.logoDataUri && INLINE_IMAGE.test(parts.logoDataUri) ? parts.logoDataUri : undefined,
    },
  });
}

/** The running footer: who and which revision on the left, "Page x of y" on the right. */
export function renderFooterTemplate(vm: PacketViewModel): string {
  const text = Handlebars.Utils.escapeExpression(vm.footerText);
  return (
    `<style>${loadAssets().footerFontFaceCss}</style>` +
    `<div style="font-family:Inter;font-size:7pt;color:#56625d;width:100%;margin:0 0.6in;display:flex;justify-content:space-between;">` +
    `<span>${text}</span><span>Page <span class="pageNumber"></span> of <span class="totalPages"></span></span></div>`
  );
}

/** Stands in for a one-page drawing in the first pass. */
const PAGE_PLACEHOLDER = '<svg xmlns="http://www.w3.org/2000/svg" width="1in" height="1in"></svg>';

/** A 1×1 transparent GIF: stands in for photos in the first pass (their frames have a fixed size). */
const PLACEHOLDER_IMAGE = 'data:image/png;base64,iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAQAAAC1HAwCAAAAC0lEQVR42mNkYAAAAAYAAjCB0C8AAAAASUVORK5CYII=';

/**
 * The drawing's root element with nothing inside: the same size and viewBox, so the same layout, for the
 * first pass, which only needs to know where pages break.
 */
function emptySvgLike(svg: string): string {
  const end = svg.indexOf('>');
  return end > 0 && svg.startsWith('<svg') ? `${svg.slice(0, end + 1)}</svg>` : svg;
}

export interface RenderedPacket {
  pdf: Buffer;
  pageCount: number;
  html: string;
  drawings: PacketDrawings;
}

/** The contents' page-number cells, one per section id (packet.html.hbs `data-toc-page`). */
const TOC_PAGE_CELL = /<span class="toc-page" data-toc-page="([a-z0-9-]+)">[^<]*<\/span>/g;

/** The drawings that fill a page of their own, by the id of their section (packet.html.hbs). */
const PAGE_DRAWINGS = [
  { section: 'site-plan', drawing: 'sitePlan' },
  { section: 'ties', drawing: 'ties' },
  { section: 'wiring', drawing: 'schematic' },
] as const;

/**
 * The whole packet pipeline: view model → drawings → HTML → PDF, in one turn of the printer.
 *
 * Page numbers for the contents come from a first print (photos and drawings replaced by empty boxes of
 * the same size, which is cheap) whose named destinations, read with pdf.js, give each section's page.
 * The final page does not wait for it, nor for the drawings: it loads at once (photos and all, the bulk
 * of Chromium's work), its site plan, ties sheet and schematic still empty and its contents' numbers
 * still dashes, while Chromium prints the draft beside it and this thread draws. The drawings and the
 * numbers are then written into that page in place: each drawing fills its own page (sized to it) and
 * the numbers' cells have a fixed width (print.css `.toc-page`) on a contents page of a fixed layout,
 * so nothing else moves, and one final print suffices. The final print's own destinations are checked
 * against the numbers it carries (printed once more, fully, should they ever differ).
 */
export async function renderPacket(
  printer: ChromiumPrinter,
  input: Omit<PacketViewModelInput, 'pageNumbers'> & {
    logoDataUri?: string;
    planImage?: PlanImage;
    onBlockedRequest?: (url: string) => void;
    /** Called after each stage with its wall time, ms (the benchmark's breakdown). */
    onStage?: (stage: 'drawings' | 'first print' | 'final load' | 'final print' | 'document info' | 'reprint', ms: number) => void;
  },
): Promise<RenderedPacket> {
  let mark = performance.now();
  const stage = (name: Parameters<NonNullable<typeof input.onStage>>[0]) => {
    const now = performance.now();
    input.onStage?.(name, now - mark);
    mark = now;
  };
  const draft = buildPacketViewModel(input);
  const qrSvg = await qrCodeSvg(input.locateUrl);
  const footerTemplate = renderFooterTemplate(draft);
  const locale = input.snapshot.settings.locale ?? null;
  // The first pass only needs to know where pages break. The site plan, ties sheet and schematic each
  // fill exactly one page of their own (sized to it: see drawPacketDrawings), so empty placeholders
  // stand in for them; depth profiles share pages and are cheap, so they are drawn first and the
  // draft has their real sizes.
  const profiles = drawPacketProfiles(input.snapshot, draft);
  // The photos the packet prints (renderPacketHtml keeps inline images only): the draft has as many frames.
  const photos = draft.photos.filter((p) => INLINE_IMAGE.test(p.dataUri));
  const placeholders = { sitePlan: PAGE_PLACEHOLDER, ties: PAGE_PLACEHOLDER, schematic: PAGE_PLACEHOLDER };
  const firstHtml = renderPacketHtml({
    vm: { ...draft, photos: photos.map((p) => ({ ...p, dataUri: PLACEHOLDER_IMAGE })) },
    drawings: { ...placeholders, profiles: profiles.map((p) => ({ ...p, svg: emptySvgLike(p.svg) })) },
    qrSvg,
    logoDataUri: input.logoDataUri,
    locale,
  });
  // The final page as it loads: the same placeholders (on portrait pages) until the drawings are in.
  const loadedHtml = renderPacketHtml({ vm: draft, drawings: { ...placeholders, profiles }, qrSvg, logoDataUri: input.logoDataUri, locale });
  const numbersFrom = (layout: { destinations: Map<string, number> }) =>
    Object.fromEntries(draft.toc.map((entry) => [entry.id, layout.destinations.get(entry.id)]).filter(([, page]) => page !== undefined)) as Record<string, number>;
  /** The final HTML with these numbers in the contents (the template's own text for a section without one). */
  const withNumbers = (html: string, numbers: Record<string, number>) =>
    html.replace(TOC_PAGE_CELL, (cell: string, id: string) => cell.replace(/>[^<]*<\/span>$/, `>${numbers[id] ?? '–'}</span>`));

  return printer.session(async (pages) => {
    // The final page first (it is the longer way to a PDF), then the draft beside it. Both pages load
    // without this thread: their requests are data: URIs, which Chromium serves itself.
    const loading = pages.load({ html: loadedHtml, footerTemplate, onBlockedRequest: input.onBlockedRequest });
    const firstPrint = pages.print({ html: firstHtml, footerTemplate, isDraft: true, onBlockedRequest: input.onBlockedRequest });
    // Both are awaited below (a failure closes the other's page); until then keep them from counting as unhandled.
    loading.catch(() => undefined);
    firstPrint.catch(() => undefined);
    let page: LoadedPage | undefined;
    let closing: Promise<void> | undefined;
    try {
      const drawings = { ...(await drawPacketDrawings(input.snapshot, draft, input.planImage, { withProfiles: false })), profiles };
      stage('drawings');
      // The record's HTML, contents' numbers still dashes: what the final page is once edited.
      const dashed = renderPacketHtml({ vm: draft, drawings, qrSvg, logoDataUri: input.logoDataUri, locale });
      let pageNumbers = numbersFrom(await readPdfLayout(await firstPrint));
      stage('first print');
      page = await loading;
      stage('final load');
      const sections = PAGE_DRAWINGS.filter(({ section }) => draft.num[section]);
      const edits: PageEdit[] = [
        ...sections.flatMap(({ section, drawing }) => [
          { selector: `#${section} > .drawing`, markup: printableHtml(drawings[drawing]) },
          ...(drawings.orientation?.[drawing] === 'landscape' ? [{ selector: `#${section}`, swapClass: ['page-portrait', 'page-landscape'] as const }] : []),
        ]),
        ...draft.toc.map((entry) => ({ selector: `[data-toc-page="${entry.id}"]`, text: String(pageNumbers[entry.id] ?? '–') })),
      ];
      const edited = await page.edit(edits);
      if (edited.some((n) => n !== 1)) throw new Error(`the final page's edits changed ${edited.join(', ')} elements, not one each`);
      const printing = page.print();
      // The record's HTML and view model while Chromium prints.
      let html = withNumbers(dashed, pageNumbers);
      let vm = buildPacketViewModel({ ...input, pageNumbers });
      let printed = await printing;
      // The page (photos and all) goes while its print is read.
      closing = page.close();
      stage('final print');
      // One pdf.js opening of the final print gives its pages, destinations and Chromium's information
      // dictionary; labelling it appends to the bytes without moving a page, so it is not read again.
      let facts = await readPdfFacts(printed);
      const printedNumbers = numbersFrom(facts.layout);
      if (!Object.entries(printedNumbers).every(([id, n]) => pageNumbers[id] === n)) {
        // Should a drawing have taken more than its page after all, the contents are printed again with
        // the pages the final print has (once: the contents page's layout is fixed, so it cannot move).
        pageNumbers = printedNumbers;
        html = withNumbers(dashed, pageNumbers);
        vm = buildPacketViewModel({ ...input, pageNumbers });
        printed = await pages.print({ html, footerTemplate, onBlockedRequest: input.onBlockedRequest });
        facts = await readPdfFacts(printed);
        stage('reprint');
      }
      const pdf = await withDocumentInfo(printed, packetDocumentInfo(vm, input.snapshot), input.snapshot.issuedAt, facts.info);
      stage('document info');
      return { pdf, pageCount: facts.layout.pageCount, html, drawings };
    } finally {
      // Whichever way this ends, neither page stays open (a failed load has closed its own).
      await (closing ?? (page ?? (await loading.catch(() => undefined)))?.close());
      await firstPrint.catch(() => undefined);
    }
  });
}

/** The PDF's document information: what a file browser or PDF reader shows before anyone opens it. */
export function packetDocumentInfo(vm: PacketViewModel, snapshot: PacketSnapshot) {
  return {
    title: vm.documentTitle,
    author: snapshot.company.name,
    subject: `As-built handover packet for ${snapshot.site.label}: ${snapshot.job.title}, revision ${snapshot.revision}`,
    keywords: ['as-built', 'handover packet', 'low-voltage landscape audio', snapshot.site.label, snapshot.job.title, `revision ${snapshot.revision}`],
  };
}
