/**
 * Reads the page of each named destination, and the page count, from a PDF written by Chromium (Skia):
 * a classic cross-reference table and uncompressed dictionaries. Chromium writes a named destination for
 * every element that an internal link (`<a href="#id">`) points at, so the packet's table of contents
 * links give us the page each section starts on without a PDF library.
 */
export interface PdfOutline {
  pageCount: number;
  /** 1-based page number by destination name. */
  destinations: Map<string, number>;
}

export function readPdfOutline(pdf: Buffer): PdfOutline {
  const text = pdf.toString('latin1');
  const startXref = /startxref\s+(\d+)\s+%%EOF\s*$/.exec(text);
  if (!startXref) throw new Error('PDF has no startxref');
  const offsets = readXref(text, Number(startXref[1]));
  const object = (n: number): string => {
    const at = offsets.get(n);
    if (at === undefined) throw new Error(`PDF object ${n} is not in the cross-reference table`);
    const end = text.indexOf('endobj', at);
    const body = text.slice(at, end);
    // The dictionary only: a stream's binary data must not be searched.
    const stream = body.indexOf('stream');
    return stream >= 0 ? body.slice(0, stream) : body;
  };
  const trailer = text.slice(text.lastIndexOf('trailer'));
  const rootRef = /\/Root\s+(\d+)\s+0\s+R/.exec(trailer);
  if (!rootRef) throw new Error('PDF trailer has no /Root');
  const catalog = object(Number(rootRef[1]));
  const pagesRef = /\/Pages\s+(\d+)\s+0\s+R/.exec(catalog);
  if (!pagesRef) throw new Error('PDF catalog has no /Pages');

  const pageOrder: number[] = [];
  const walk = (n: number, depth: number): void => {
    if (depth > 32) throw new Error('PDF page tree too deep');
    const node = object(n);
    if (/\/Type\s*\/Pages\b/.test(node)) {
      const kids = /\/Kids\s*\[([^\]]*)\]/.exec(node)?.[1] ?? '';
      for (const ref of kids.matchAll(/(\d+)\s+0\s+R/g)) walk(Number(ref[1]), depth + 1);
    } else {
      pageOrder.push(n);
    }
  };
  walk(Number(pagesRef[1]), 0);
  const pageIndex = new Map(pageOrder.map((n, i) => [n, i + 1]));

  const destinations = new Map<string, number>();
  const destsRef = /\/Dests\s+(\d+)\s+0\s+R/.exec(catalog);
  if (destsRef) {
    const dests = object(Number(destsRef[1]));
    for (const match of dests.matchAll(/\/([^\s/[\]<>()]+)\s*\[\s*(\d+)\s+0\s+R/g)) {
      const name = match[1]!.replace(/#([0-9a-fA-F]{2})/g, (_m, hex: string) => String.fromCharCode(parseInt(hex, 16)));
      const page = pageIndex.get(Number(match[2]));
      if (page !== undefined) destinations.set(name, page);
    }
  }
  return { pageCount: pageOrder.length, destinations };
}

function readXref(text: string, offset: number): Map<number, number> {
  const offsets = new Map<number, number>();
  if (!text.startsWith('xref', offset)) throw new Error('PDF cross-reference stream not supported');
  const lines = text.slice(offset + 4, text.indexOf('trailer', offset)).trim().split(/\r?\n|\r/);
  let i = 0;
  while (i < lines.length) {
    const header = /^(\d+)\s+(\d+)$/.exec(lines[i]!.trim());
    if (!header) break;
    const first = Number(header[1]);
    const count = Number(header[2]);
    for (let k = 0; k < count; k += 1) {
      const entry = lines[i + 1 + k]?.trim() ?? '';
      const [pos, , kind] = entry.split(/\s+/);
      if (kind === 'n') offsets.set(first + k, Number(pos));
    }
    i += count + 1;
  }
  return offsets;
}
