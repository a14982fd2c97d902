import { execFileSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

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
