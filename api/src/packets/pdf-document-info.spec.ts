import { getDocumentProxy, getMeta } from 'unpdf';
import { describe, expect, it } from 'vitest';

import { readPdfFacts, readPdfLayout, withDocumentInfo } from './pdf-document-info.js';

/**
 * A two-page PDF written by hand with a named destination on page 2, in either cross-reference form
 * (ISO 32000-1 §7.5.4 table, §7.5.8 stream), so both update paths are read back by pdf.js.
 */
function handWrittenPdf(form: 'table' | 'stream'): Buffer {
  const objects = [
    '<< /Type /Catalog /Pages 2 0 R /Dests 5 0 R >>',
    '<< /Type /Pages /Kids [3 0 R 4 0 R] /Count 2 >>',
    '<< /Type /Page /Parent 2 0 R /MediaBox [0 0 612 792] >>',
    '<< /Type /Page /Parent 2 0 R /MediaBox [0 0 612 792] >>',
    '<< /cables [4 0 R /XYZ 0 792 0] >>',
    '<< /Title (Printed title) /Producer (Hand/PDF) >>',
  ];
  let body = '%PDF-1.5\n';
  const offsets: number[] = [];
  objects.forEach((o, i) => {
    offsets.push(body.length);
    body += `${i + 1} 0 obj\n${o}\nendobj\n`;
  });
  const xrefAt = body.length;
  if (form === 'table') {
    body += `xref\n0 ${objects.length + 1}\n0000000000 65535 f \n${offsets.map((o) => `${String(o).padStart(10, '0')} 00000 n \n`).join('')}`;
    body += `trailer\n<< /Size ${objects.length + 1} /Root 1 0 R /Info 6 0 R >>\nstartxref\n${xrefAt}\n%%EOF\n`;
    return Buffer.from(body, 'latin1');
  }
  const rows = [Buffer.from([0, 0, 0, 0, 0, 0xff, 0xff]), ...[...offsets, xrefAt].map((o) => {
    const b = Buffer.alloc(7);
    b.writeUInt8(1, 0);
    b.writeUInt32BE(o, 1);
    return b;
  })];
  const data = Buffer.concat(rows);
  const n = objects.length + 1;
  return Buffer.concat([
    Buffer.from(`${body}${n} 0 obj\n<< /Type /XRef /Size ${n + 1} /W [1 4 2] /Root 1 0 R /Info 6 0 R /Length ${data.length} >>\nstream\n`, 'latin1'),
    data,
    Buffer.from(`\nendstream\nendobj\nstartxref\n${xrefAt}\n%%EOF\n`, 'latin1'),
  ]);
}

describe('PDF layout and document information (pdf.js)', () => {
  for (const form of ['table', 'stream'] as const) {
    it(`reads pages and destinations and sets the information dictionary (cross-reference ${form})`, async () => {
      const pdf = handWrittenPdf(form);
      expect(await readPdfLayout(pdf)).toEqual({ pageCount: 2, destinations: new Map([['cables', 2]]) });
      const labelled = await withDocumentInfo(
        pdf,
        { title: 'Handover packet — Back yard — Rev 1', author: 'Fernbrook Sound & Light', subject: 'As-built', keywords: ['as-built', 'Žárovka Ω'] },
        '2026-12-02T17:00:00.000Z',
      );
      // An incremental update: the printed bytes are kept as they were.
      expect(labelled.subarray(0, pdf.length).equals(pdf)).toBe(true);
      const doc = await getDocumentProxy(new Uint8Array(labelled));
      const info = (await getMeta(doc)).info as Record<string, unknown>;
      await doc.destroy();
      expect(info).toMatchObject({
        Title: 'Handover packet — Back yard — Rev 1',
        Author: 'Fernbrook Sound & Light',
        Subject: 'As-built',
        Keywords: 'as-built, Žárovka Ω',
        Producer: 'Hand/PDF',
      });
      expect(await readPdfLayout(labelled)).toEqual({ pageCount: 2, destinations: new Map([['cables', 2]]) });
    });
  }

  it('reads layout and printed information in one opening, and labels from that information the same bytes', async () => {
    for (const form of ['table', 'stream'] as const) {
      const pdf = handWrittenPdf(form);
      const facts = await readPdfFacts(pdf);
      expect(facts.layout).toEqual({ pageCount: 2, destinations: new Map([['cables', 2]]) });
      expect(facts.info).toMatchObject({ Producer: 'Hand/PDF' });
      const info = { title: 'T', author: 'A', subject: 'S', keywords: ['k'] };
      const fromFacts = await withDocumentInfo(pdf, info, '2026-12-02T17:00:00.000Z', facts.info);
      expect(fromFacts.equals(await withDocumentInfo(pdf, info, '2026-12-02T17:00:00.000Z')), form).toBe(true);
      expect(await readPdfLayout(fromFacts)).toEqual(facts.layout);
    }
  });

  it('refuses bytes that are not a PDF', async () => {
    await expect(withDocumentInfo(Buffer.from('not a pdf'), { title: 't', author: 'a', subject: 's', keywords: [] }, '2026-12-02T17:00:00.000Z')).rejects.toThrow();
  });
});
