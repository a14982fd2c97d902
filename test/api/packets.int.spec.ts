import { createHash } from 'node:crypto';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

import type { NestExpressApplication } from '@nestjs/platform-express';
import request from 'supertest';
import { getDocumentProxy, getMeta } from 'unpdf';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { DEMO_AS_BUILT } from '../../api/src/domain/as-built/demo-as-built.js';
import { PACKET_SECTIONS } from '../../api/src/domain/packet/packet.view-model.js';
import { createCompany, type TestCompany, withDb } from '../support/fixtures.js';
import { type Api, apiAs, createJob, createSite, type JobFixture, moveJob, recordAsBuilt } from '../support/records.js';
import { bearer, signIn } from '../support/session.js';
import { hyphenRuns, pdfFontNames, pdfFonts, pdfPages, pdfPageSize, readArchiveFile, verifyArchive } from '../print/packet-pdf.js';
import { makeFieldPhoto } from '../fixtures/photos/make-photos.js';

const PHOTO_CAPTION = 'Open trench at the patio splice, tape at 30 cm';

// ConfigModule reads the environment when AppModule is imported: set this file's settings first.
Object.assign(process.env, {
  PACKET_WORKER_IN_API: 'true',
  QUEUE_POLL_INTERVAL_SECONDS: '0.5',
  UPLOADS_DIR: mkdtempSync(join(tmpdir(), 'loamline-packets-uploads-')),
});

async function waitForStatus(api: Api, id: string, statuses: string[], timeoutMs = 90_000) {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const body = await api.expectOk('get', `/api/packets/${id}`);
    if (statuses.includes(body.status)) return body;
    if (Date.now() > deadline) throw new Error(`packet ${id} still ${body.status} after ${timeoutMs} ms`);
    await new Promise((resolve) => setTimeout(resolve, 300));
  }
}

describe('handover packets (the demo job, rendered in Chromium)', () => {
  let app: NestExpressApplication;
  let company: TestCompany;
  let office: Api;
  let lead: Api;
  let job: JobFixture;
  let packet: { id: string; status: string; revision: number; jobVersion: number };
  let pdf: Buffer;
  let pages: string[];
  let pdfDisposition: string;

  /** A job with the demo as-built, moved to ready to issue. */
  async function readyJob(): Promise<JobFixture> {
    const { siteId } = await createSite(office, DEMO_AS_BUILT.site);
    const created = await createJob(office, siteId, { crewLeadUserId: company.users.lead.id });
    const recorded = await recordAsBuilt(lead, created, DEMO_AS_BUILT);
    const upload = await request(app.getHttpServer())
      .post(`/api/jobs/${created.id}/photos`)
      .set(bearer(await signIn(app, company.users.lead)))
      .set('If-Match', `"${recorded.version}"`)
      .field('caption', PHOTO_CAPTION)
      .attach('files', await makeFieldPhoto(), { filename: 'trench.jpg', contentType: 'image/jpeg' });
    expect(upload.status, JSON.stringify(upload.body)).toBe(201);
    const submitted = await moveJob(lead, { ...created, version: upload.body.jobVersion }, 'in_progress', 'submitted');
    return moveJob(office, submitted, 'ready_to_issue');
  }

  beforeAll(async () => {
    const { createTestApp } = await import('../support/test-app.js');
    app = await createTestApp();
    company = await createCompany('Packet Render');
    // A4 and metric, the non-default settings, so the PDF proves it follows them.
    await withDb((db) =>
      db.query(
        `insert into company_settings (company_id, paper_size, units, licence_numbers, contact_phone, contact_email)
         values ($1, 'a4', 'metric', array['Licence LV-0000 (invented)'], '+1 555 0100', 'office@packet.example')`,
        [company.id],
      ),
    );
    office = apiAs(app, await signIn(app, company.users.office));
    lead = apiAs(app, await signIn(app, company.users.lead));
    job = await readyJob();
    const res = await office.send('post', `/api/jobs/${job.id}/packets`, undefined, { 'If-Match': `"${job.version}"` });
    expect(res.status).toBe(201);
    packet = res.body;
    const ready = await waitForStatus(office, packet.id, ['ready', 'failed']);
    expect(ready).toMatchObject({ status: 'ready', failureReason: null, attempts: 1 });
    const download = await request(app.getHttpServer())
      .get(`/api/packets/${packet.id}/pdf`)
      .set(bearer(await signIn(app, company.users.tech)))
      .buffer(true)
      .parse((response, callback) => {
        const chunks: Buffer[] = [];
        response.on('data', (c: Buffer) => chunks.push(c));
        response.on('end', () => callback(null, Buffer.concat(chunks)));
      });
    expect(download.status).toBe(200);
    expect(download.headers['content-type']).toBe('application/pdf');
    pdfDisposition = String(download.headers['content-disposition']);
    pdf = download.body as Buffer;
    expect(download.headers.etag).toBe(`"${createHash('sha256').update(pdf).digest('hex')}"`);
    pages = await pdfPages(pdf);
    // To look at the rendered packet: PACKET_PDF_OUT=/tmp/packet.pdf npx vitest run test/api/packets.int.spec.ts
    if (process.env.PACKET_PDF_OUT) writeFileSync(process.env.PACKET_PDF_OUT, pdf);
  }, 180_000);

  afterAll(async () => {
    await app?.close();
  });

  it('should issue revision 1, move the job to issued and report the files', async () => {
    expect(packet).toMatchObject({ status: 'queued', revision: 1 });
    const jobNow = await office.expectOk('get', `/api/jobs/${job.id}`);
    expect(jobNow).toMatchObject({ status: 'issued', version: packet.jobVersion });
    const list = await lead.expectOk('get', `/api/jobs/${job.id}/packets`);
    expect(list).toHaveLength(1);
    expect(list[0]).toMatchObject({ id: packet.id, status: 'ready', paperSize: 'a4', pageCount: pages.length });
    expect(list[0].pdf.sha256).toBe(createHash('sha256').update(pdf).digest('hex'));
  });

  it('should print every section heading, on the page the contents give', () => {
    expect(pdf.subarray(0, 5).toString()).toBe('%PDF-');
    const contents = pages[1]!;
    expect(contents).toContain('Contents');
    // Nothing was acknowledged at issue, so there is no Known exceptions section, and it is the site's
    // first packet, so there is no What changed; every other section has content.
    const printed = PACKET_SECTIONS.filter((section) => section.id !== 'known-exceptions' && section.id !== 'what-changed');
    expect(contents).not.toContain('Known exceptions');
    for (const section of printed) {
      const entry = new RegExp(`${section.title} (\\d+)`).exec(contents);
      expect(entry, section.title).not.toBeNull();
      const page = Number(entry![1]);
      expect(pages[page - 1], `${section.title} on page ${page}`).toContain(section.title);
    }
    // The Engineering notes appendix is the last section, at the back.
    expect(pages.at(-1)).toContain('How the figures were computed');
  });

  it("should print the job's photos with their captions in the appendix", () => {
    expect(pages.join(' ')).toContain(PHOTO_CAPTION);
  });

  it('should number every page "Page x of y"', () => {
    pages.forEach((text, i) => expect(text).toContain(`Page ${i + 1} of ${pages.length}`));
  });

  it('should list every run of the cable schedule in metric units', () => {
    const schedule = pages.join(' ');
    for (const run of DEMO_AS_BUILT.runs) expect(schedule).toContain(run.label);
    expect(schedule).toContain('3.31 mm² (12 AWG)');
    expect(schedule).toMatch(/Patio splice to P2.*11 cm/);
  });

  it('should carry the locate page and the safety cautions', () => {
    const text = pages.join(' ');
    expect(text).toContain('Before you dig: contact the one-call center');
    expect(text).toContain('One-call locators do not mark the cables of this installation');
    expect(text).toContain('Hand-dig within the tolerance zone');
    expect(text).toContain('Within 0.5 m on either side of a mapped route');
    expect(text).toContain('Depths are as installed');
    expect(text).toContain('must be done by a licensed electrician');
    expect(text).toContain('Line-voltage work is not part of this installation');
    expect(text).toContain('they are not a code inspection or approval');
    // Signatures not collected are left out, with one line saying so.
    expect(text).toContain('The walkthrough was not signed.');
    expect(text).not.toContain('Not signed');
  });

  it('should print hyphens tight: every hyphenated run as wide as the plain font makes it, not the tabular one', async () => {
    // Inter's `tnum` feature swaps the hyphen for a tabular glyph 0.19 em wider; set on the whole page it
    // printed "low - voltage" and "one - call". Tabular figures now apply to numeric cells only. Each run's
    // printed width (pdf.js glyph positions) is compared with fontkit's layout of the shipped font.
    const runs = await hyphenRuns(pdf);
    expect(runs.map((r) => r.text).join(' ')).toMatch(/low-voltage|one-call/);
    const telling = runs.filter((r) => r.tabularPt - r.plainPt > 0.5);
    expect(telling.length).toBeGreaterThan(3);
    const wide = telling.filter((r) => Math.abs(r.printedPt - r.plainPt) > Math.abs(r.printedPt - r.tabularPt));
    expect(wide.map((r) => `p${r.page}: ${r.text}`)).toEqual([]);
  });

  it('should embed Inter only (no fallback font) on A4 paper', () => {
    const fonts = pdfFonts(pdf);
    expect(fonts.length).toBeGreaterThan(0);
    for (const font of fonts) {
      expect(font.isEmbedded, font.name).toBe(true);
      // Inter's static faces embed as named TrueType subsets. The only unnamed fonts are Type 3 outlines
      // Chromium makes of stroked glyphs (the white halo behind plan labels), drawn from the same faces.
      if (font.type === 'Type 3') expect(font.name).toBe('[none]');
      else expect(font.name).toMatch(/^[A-Z]{6}\+Inter-(Regular|Medium|SemiBold|Bold|Italic)$/);
    }
    expect(new Set(fonts.filter((f) => f.type !== 'Type 3').map((f) => f.name.slice(7)))).toEqual(
      new Set(['Inter-Regular', 'Inter-Medium', 'Inter-SemiBold', 'Inter-Bold', 'Inter-Italic']),
    );
    const names = pdfFontNames(pdf);
    expect(names.length).toBeGreaterThan(0);
    expect(names.filter((n) => !n.startsWith('Inter'))).toEqual([]);
    expect(pdfPageSize(pdf)).toMatch(/\(A4\)/);
  });

  it('should serve an archive whose manifest verifies', async () => {
    const res = await request(app.getHttpServer())
      .get(`/api/packets/${packet.id}/archive.zip`)
      .set(bearer(await signIn(app, company.users.office)))
      .buffer(true)
      .parse((response, callback) => {
        const chunks: Buffer[] = [];
        response.on('data', (c: Buffer) => chunks.push(c));
        response.on('end', () => callback(null, Buffer.concat(chunks)));
      });
    expect(res.status).toBe(200);
    const { files, check } = verifyArchive(res.body as Buffer);
    const photoFiles = files.filter((f) => f.startsWith('photos/'));
    expect(photoFiles).toHaveLength(1);
    const pdfName = /^attachment; filename="([a-z0-9-]+\.pdf)"$/.exec(pdfDisposition)?.[1];
    expect(pdfName).toMatch(/^fixture-yard-\d+-fixture-job-\d+-rev-1\.pdf$/);
    expect(res.headers['content-disposition']).toBe(`attachment; filename="${pdfName!.replace(/\.pdf$/, '.zip')}"`);
    expect(files.filter((f) => !f.startsWith('photos/'))).toEqual(
      [
        'MANIFEST.sha256',
        'README.txt',
        'as-built.json',
        'cable-schedule.csv',
        pdfName!,
        'runs-and-items.geojson',
        'runs-and-items.kml',
        'site-plan.svg',
        'wiring-schematic.svg',
      ].sort(),
    );
    expect(check.trim().split('\n')).toHaveLength(files.length - 1);
    expect(check).not.toContain('FAILED');
    // The PDF in the archive is the one downloaded.
    expect(readArchiveFile(res.body as Buffer, pdfName!).equals(pdf)).toBe(true);
    // The CSV starts with a UTF-8 byte-order mark; a metric company gets the SI columns only.
    const csv = readArchiveFile(res.body as Buffer, 'cable-schedule.csv');
    expect([...csv.subarray(0, 3)]).toEqual([0xef, 0xbb, 0xbf]);
    const header = csv.subarray(3).toString('utf8').split('\r\n')[0]!;
    expect(header).toMatch(/^run,from,to,cable_type,gauge,conductors,length_m,method,min_depth_m,max_depth_m,/);
    expect(header).not.toContain('_ft');
    const readme = readArchiveFile(res.body as Buffer, 'README.txt').toString('utf8');
    for (const file of files.filter((f) => !f.startsWith('photos/') && f !== 'README.txt')) expect(readme, file).toContain(file);
    expect(readme).toContain('photos/');
    expect(readme).toContain('WGS 84');
    expect(readme).toContain('plan metres');
    const kml = readArchiveFile(res.body as Buffer, 'runs-and-items.kml').toString('utf8');
    expect(kml).toContain('<kml xmlns="http://www.opengis.net/kml/2.2">');
    expect((kml.match(/<Placemark>/g) ?? []).length).toBe(DEMO_AS_BUILT.runs.length + DEMO_AS_BUILT.items.length);
  });

  it('should carry title, author, subject and keywords, and a bookmark per section (read back with pdf.js)', async () => {
    const doc = await getDocumentProxy(new Uint8Array(pdf));
    const info = (await getMeta(doc)).info as Record<string, unknown>;
    const outline = (await doc.getOutline()) ?? [];
    const tree = (await (await doc.getPage(1)).getStructTree()) as { children?: unknown[] } | null;
    await doc.destroy();
    expect(info.Title).toMatch(/^Handover packet — Fixture job \d+ — Revision 1$/);
    expect(info.Author).toMatch(/^Packet Render \w+$/);
    expect(info.Subject).toMatch(/^As-built handover packet for Fixture yard \d+/);
    expect(info.Keywords).toContain('as-built');
    // Chromium nests the outline by heading level: walk the whole tree.
    type Node = { title: string; items: Node[] };
    const all = (nodes: Node[]): string[] => nodes.flatMap((n) => [n.title, ...all(n.items)]);
    const titles = all(outline as Node[]).join(' | ');
    // Every section the contents page lists has its bookmark.
    const listed = PACKET_SECTIONS.filter((section) => pages[1]!.includes(section.title));
    expect(listed.length).toBeGreaterThan(10);
    for (const section of listed) expect(titles, section.title).toContain(section.title);
    // Tagged: page 1 has a structure tree (Chromium's tagged PDF).
    expect(tree?.children?.length ?? 0).toBeGreaterThan(0);
  });

  it('should refuse to issue a job that is not ready to issue, or with a stale version', async () => {
    const again = await office.send('post', `/api/jobs/${job.id}/packets`, undefined, { 'If-Match': `"${packet.jobVersion}"` });
    expect(again.status).toBe(409);
    expect(again.body.code).toBe('JOB_NOT_READY_TO_ISSUE');
    const other = await readyJob();
    const stale = await office.send('post', `/api/jobs/${other.id}/packets`, undefined, { 'If-Match': `"${other.version - 1}"` });
    expect(stale.status).toBe(412);
    expect(stale.body.code).toBe('VERSION_CONFLICT');
  });

  it('should create one revision when the same job is issued twice at once', async () => {
    const other = await readyJob();
    const results = await Promise.all(
      [0, 1, 2].map(() => office.send('post', `/api/jobs/${other.id}/packets`, undefined, { 'If-Match': `"${other.version}"` })),
    );
    expect(results.map((r) => r.status).sort()).toEqual([201, 409, 409]);
    const revisions = await withDb((db) => db.query('select revision from packet_revisions where job_id = $1', [other.id]));
    expect(revisions.rows).toEqual([{ revision: 1 }]);
  });
});
