import { execFileSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';

import * as fontkit from 'fontkit';
import { extractText, getDocumentProxy } from 'unpdf';

/** The text of each page of a PDF (unpdf, pdf.js), whitespace collapsed to single spaces. */
export async function pdfPages(pdf: Buffer): Promise<string[]> {
  const doc = await getDocumentProxy(new Uint8Array(pdf));
  const { text } = await extractText(doc, { mergePages: false });
  return (text as string[]).map((page) => page.replace(/\s+/g, ' ').trim());
}

function toFile(pdf: Buffer): string {
  const path = join(mkdtempSync(join(tmpdir(), 'packet-test-')), 'packet.pdf');
  writeFileSync(path, pdf);
  return path;
}

/**
 * The PDF's text as poppler's `pdftotext -layout` reads it (words broken where the glyph positions
 * leave a gap), for text that pdf.js would split across items.
 */
export function pdfLayoutText(pdf: Buffer): string {
  return execFileSync('pdftotext', ['-layout', toFile(pdf), '-'], { encoding: 'utf8' });
}

const INTER_FACES = ['400-normal', '500-normal', '600-normal', '700-normal', '400-italic'].map((face) =>
  fontkit.openSync(fileURLToPath(new URL(`../../fonts/inter-static/inter-latin-${face}.woff2`, import.meta.url))),
);

export interface HyphenRun {
  text: string;
  page: number;
  /** Width of the run as printed (pdf.js glyph positions), points. */
  printedPt: number;
  /** Width the shipped font gives the same text at the same size without / with tabular figures. */
  plainPt: number;
  tabularPt: number;
}

/**
 * Every printed text run with a hyphen between letters, its printed width read from the PDF's glyph
 * positions (pdf.js), and what the shipped Inter font (fontkit) makes of the same text at the same size
 * with and without the `tnum` feature, in whichever weight fits the printed width best. Inter's `tnum`
 * swaps the hyphen for a tabular glyph about 0.19 em wider, which printed "Back - yard".
 */
export async function hyphenRuns(pdf: Buffer): Promise<HyphenRun[]> {
  const doc = await getDocumentProxy(new Uint8Array(pdf));
  const runs: HyphenRun[] = [];
  for (let p = 1; p <= doc.numPages; p++) {
    const content = await (await doc.getPage(p)).getTextContent();
    for (const item of content.items) {
      if (!('str' in item) || !/\p{L}-\p{L}/u.test(item.str)) continue;
      const size = Math.hypot(item.transform[0]!, item.transform[1]!);
      const widths = INTER_FACES.map((face) => {
        const at = (features: string[]) => (face.layout(item.str, features).advanceWidth * size) / face.unitsPerEm;
        return { plainPt: at([]), tabularPt: at(['tnum']) };
      });
      const best = widths.reduce((a, b) =>
        Math.min(Math.abs(a.plainPt - item.width), Math.abs(a.tabularPt - item.width)) <=
        Math.min(Math.abs(b.plainPt - item.width), Math.abs(b.tabularPt - item.width))
          ? a
          : b,
      );
      runs.push({ text: item.str, page: p, printedPt: item.width, ...best });
    }
  }
  return runs;
}

export interface PdfFontRow {
  name: string;
  type: string;
  isEmbedded: boolean;
}

/** `pdffonts` rows (poppler-utils). */
export function pdfFonts(pdf: Buffer): PdfFontRow[] {
  const out = execFileSync('pdffonts', [toFile(pdf)], { encoding: 'utf8' });
  return out
    .split('\n')
    .slice(2)
    .filter((line) => line.trim() !== '')
    .map((line) => {
      const name = line.slice(0, 37).trim();
      const type = line.slice(37, 55).trim();
      const rest = line.slice(55).trim().split(/\s+/);
      return { name, type, isEmbedded: rest[1] === 'yes' };
    });
}

/** Every `/FontName` in the PDF's font descriptors (subset prefixes such as `ABCDEF+` removed). */
export function pdfFontNames(pdf: Buffer): string[] {
  return [...pdf.toString('latin1').matchAll(/\/FontName\s*\/([^\s/<>[\]]+)/g)].map((m) => m[1]!.replace(/^[A-Z]{6}\+/, ''));
}

/** `pdfinfo`'s "Page size" line, e.g. `612 x 792 pts (letter)`. */
export function pdfPageSize(pdf: Buffer): string {
  const out = execFileSync('pdfinfo', [toFile(pdf)], { encoding: 'utf8' });
  return /Page size:\s+(.*)/.exec(out)?.[1]?.trim() ?? '';
}

/** Runs `sha256sum -c MANIFEST.sha256` in the unzipped archive; returns its output (throws on a mismatch). */
export function verifyArchive(zip: Buffer): { files: string[]; check: string } {
  const dir = mkdtempSync(join(tmpdir(), 'packet-zip-'));
  writeFileSync(join(dir, 'archive.zip'), zip);
  execFileSync('unzip', ['-q', 'archive.zip', '-d', 'out'], { cwd: dir });
  const files = execFileSync('find', ['.', '-type', 'f'], { cwd: join(dir, 'out'), encoding: 'utf8' })
    .split('\n')
    .filter(Boolean)
    .map((f) => f.replace(/^\.\//, ''))
    .sort();
  const check = execFileSync('sha256sum', ['-c', 'MANIFEST.sha256'], { cwd: join(dir, 'out'), encoding: 'utf8' });
  return { files, check };
}

/** One file's bytes from a zip (`unzip -p`). */
export function readArchiveFile(zip: Buffer, path: string): Buffer {
  const dir = mkdtempSync(join(tmpdir(), 'packet-zip-'));
  writeFileSync(join(dir, 'archive.zip'), zip);
  return execFileSync('unzip', ['-p', 'archive.zip', path], { cwd: dir, maxBuffer: 64 * 1024 * 1024 });
}

/**
 * Every metric quantity in a text: a number followed by km, m, cm or mm (`12.7 cm`, `4 m`, `150 mm`), and
 * a conductor size in mm² that is not followed by its AWG equivalent (`2.5 mm² (≈ 13 AWG)` is how an
 * imperial reader is shown a metric cable, `2.5 mm²` alone is not). Used on an imperial packet's text,
 * where none may appear.
 */
export function metricValues(text: string): string[] {
  const lengths = [...text.matchAll(/(?<![\w.,])\d+(?:[.,]\d+)?\s?(?:km|m|cm|mm)(?![\w²])/g)].map((m) => m[0]);
  const areas = [...text.matchAll(/(?<![\w.,])\d+(?:[.,]\d+)?\s?mm²(?!\s*\(≈)/g)].map((m) => m[0]);
  return [...lengths, ...areas];
}
