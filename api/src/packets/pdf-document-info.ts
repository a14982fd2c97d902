import { getDocumentProxy, getMeta } from 'unpdf';

/**
 * Reading and labelling the PDFs Chromium prints, with pdf.js (bundled by `unpdf`) instead of pattern
 * matching over the bytes: it understands classic cross-reference tables, cross-reference streams and
 * object streams alike, so the day Chromium changes how it writes a PDF nothing here breaks.
 */

export interface PdfLayout {
  pageCount: number;
  /** 1-based page number by named destination (Chromium writes one per internal link target). */
  destinations: Map<string, number>;
}

/** Page count and the page of every named destination. */
export async function readPdfLayout(pdf: Buffer | Uint8Array): Promise<PdfLayout> {
  // pdf.js takes ownership of (detaches) the array it is given: hand it a copy.
  const doc = await getDocumentProxy(new Uint8Array(pdf));
  try {
    return await layoutOf(doc);
  } finally {
    await doc.destroy();
  }
}

/**
 * The layout and the document information dictionary as printed, from one opening of the PDF. The
 * packet reads both from the final print (a few MiB with its photos) before labelling it: the
 * incremental update of {@link withDocumentInfo} changes neither pages nor destinations, so the
 * labelled file is not opened again.
 */
export async function readPdfFacts(pdf: Buffer | Uint8Array): Promise<{ layout: PdfLayout; info: Record<string, unknown> }> {
  // pdf.js takes ownership of (detaches) the array it is given: hand it a copy.
  const doc = await getDocumentProxy(new Uint8Array(pdf));
  try {
    const info = ((await getMeta(doc)).info ?? {}) as Record<string, unknown>;
    return { layout: await layoutOf(doc), info };
  } finally {
    await doc.destroy();
  }
}

async function layoutOf(doc: Awaited<ReturnType<typeof getDocumentProxy>>): Promise<PdfLayout> {
  const destinations = new Map<string, number>();
  const named = (await doc.getDestinations()) as Record<string, unknown[] | null>;
  for (const [name, dest] of Object.entries(named)) {
    const ref = dest?.[0];
    if (ref && typeof ref === 'object') {
      destinations.set(name, (await doc.getPageIndex(ref as { num: number; gen: number })) + 1);
    } else if (typeof ref === 'number') {
      destinations.set(name, ref + 1);
    }
  }
  return { pageCount: doc.numPages, destinations };
}

export interface PdfDocumentInfo {
  title: string;
  author: string;
  subject: string;
  keywords: readonly string[];
}

/** A PDF text string as UTF-16BE with its byte-order mark, in hex: any character, no escaping rules. */
function pdfText(value: string): string {
  const units: string[] = ['FEFF'];
  for (let i = 0; i < value.length; i += 1) units.push(value.charCodeAt(i).toString(16).padStart(4, '0').toUpperCase());
  return `<${units.join('')}>`;
}

/** A PDF date string, e.g. `D:20261202171256Z`. */
function pdfDate(iso: string): string {
  const d = new Date(iso);
  const p = (n: number, w = 2) => String(n).padStart(w, '0');
  return `D:${p(d.getUTCFullYear(), 4)}${p(d.getUTCMonth() + 1)}${p(d.getUTCDate())}${p(d.getUTCHours())}${p(d.getUTCMinutes())}${p(d.getUTCSeconds())}Z`;
}

/** A PDF literal string for ASCII metadata we read back (producer, creator, dates). */
function pdfLiteral(value: string): string {
  return `(${value.replace(/[\\()]/g, (c) => `\\${c}`).replace(/[^\x20-\x7e]/g, '?')})`;
}

/**
 * The PDF with its document information (title, author, subject, keywords) set, as an incremental
 * update (ISO 32000-1 §7.5.6): the printed bytes stay as they are and a new information dictionary, a
 * cross-reference section for it and a trailer pointing back at the previous one are appended. Chromium
 * writes only the title (from `<title>`); the producer, creator and dates it wrote are carried over.
 * `printedInfo` is that dictionary when the caller has already read it ({@link readPdfFacts}); otherwise
 * the PDF is opened to read it.
 */
export async function withDocumentInfo(pdf: Buffer, info: PdfDocumentInfo, createdAt: string, printedInfo?: Record<string, unknown>): Promise<Buffer> {
  const previous = printedInfo ?? (await readPdfFacts(pdf)).info;
  const tail = pdf.subarray(Math.max(0, pdf.length - 1024)).toString('latin1');
  const startMatch = /startxref\s+(\d+)\s+%%EOF\s*$/.exec(tail);
  if (!startMatch) throw new Error('PDF has no startxref at its end');
  const prevXref = Number(startMatch[1]);
  const atXref = pdf.subarray(prevXref, prevXref + 16).toString('latin1');
  const isXrefStream = !atXref.startsWith('xref');
  // The previous trailer dictionary (classic) or cross-reference stream dictionary: plain text either way.
  const dictStart = isXrefStream ? prevXref : pdf.indexOf('trailer', prevXref, 'latin1');
  const dictEnd = pdf.indexOf(isXrefStream ? 'stream' : 'startxref', dictStart, 'latin1');
  if (dictStart < 0 || dictEnd < 0) throw new Error('PDF trailer not found');
  const trailer = pdf.subarray(dictStart, dictEnd).toString('latin1');
  const root = /\/Root\s+(\d+\s+\d+\s+R)/.exec(trailer)?.[1];
  const size = Number(/\/Size\s+(\d+)/.exec(trailer)?.[1]);
  if (!root || !Number.isInteger(size) || size < 1) throw new Error('PDF trailer has no /Root or /Size');
  const id = /\/ID\s*(\[[^\]]*\])/.exec(trailer)?.[1];

  const carried = (key: string, fallback: string) => (typeof previous[key] === 'string' && previous[key] ? String(previous[key]) : fallback);
  const fields = [
    `/Title ${pdfText(info.title)}`,
    `/Author ${pdfText(info.author)}`,
    `/Subject ${pdfText(info.subject)}`,
    `/Keywords ${pdfText(info.keywords.join(', '))}`,
    `/Creator ${pdfLiteral(carried('Creator', 'Loamline'))}`,
    `/Producer ${pdfLiteral(carried('Producer', 'Loamline'))}`,
    `/CreationDate ${pdfLiteral(carried('CreationDate', pdfDate(createdAt)))}`,
    `/ModDate ${pdfLiteral(carried('ModDate', pdfDate(createdAt)))}`,
  ];
  const infoNumber = size;
  const needsNewline = pdf[pdf.length - 1] !== 0x0a;
  const infoOffset = pdf.length + (needsNewline ? 1 : 0);
  const infoObject = `${infoNumber} 0 obj\n<< ${fields.join(' ')} >>\nendobj\n`;
  const xrefOffset = infoOffset + Buffer.byteLength(infoObject, 'latin1');
  let update: Buffer;
  if (!isXrefStream) {
    const section =
      `xref\n${infoNumber} 1\n${String(infoOffset).padStart(10, '0')} 00000 n \n` +
      `trailer\n<< /Size ${size + 1} /Root ${root} /Info ${infoNumber} 0 R /Prev ${prevXref}${id ? ` /ID ${id}` : ''} >>\n` +
      `startxref\n${xrefOffset}\n%%EOF\n`;
    update = Buffer.from(infoObject + section, 'latin1');
  } else {
    // The previous section is a cross-reference stream: continue with one (uncompressed, /W [1 4 2]),
    // indexing the information dictionary and this stream itself.
    const streamNumber = size + 1;
    const row = (type: number, offset: number) => {
      const b = Buffer.alloc(7);
      b.writeUInt8(type, 0);
      b.writeUInt32BE(offset, 1);
      b.writeUInt16BE(0, 5);
      return b;
    };
    const data = Buffer.concat([row(1, infoOffset), row(1, xrefOffset)]);
    const head =
      `${streamNumber} 0 obj\n<< /Type /XRef /Size ${size + 2} /Index [${infoNumber} 2] /W [1 4 2] /Length ${data.length}` +
      ` /Root ${root} /Info ${infoNumber} 0 R /Prev ${prevXref}${id ? ` /ID ${id}` : ''} >>\nstream\n`;
    update = Buffer.concat([
      Buffer.from(infoObject + head, 'latin1'),
      data,
      Buffer.from(`\nendstream\nendobj\nstartxref\n${xrefOffset}\n%%EOF\n`, 'latin1'),
    ]);
  }
  return Buffer.concat([pdf, ...(needsNewline ? [Buffer.from('\n')] : []), update]);
}
