import { execFileSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { mkdtemp, readdir, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join, relative } from 'node:path';

import type { NestExpressApplication } from '@nestjs/platform-express';
import exifr from 'exifr';
import sharp from 'sharp';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { DEMO_AS_BUILT } from '../../api/src/domain/as-built/demo-as-built.js';
import { DiskStorage } from '../../api/src/storage/disk-storage.js';
import { OBJECT_STORAGE } from '../../api/src/storage/object-storage.js';
import { makeFieldPhoto, makeHeicHeader, makePixelBombPng, makePng, makeWebp } from '../fixtures/photos/make-photos.js';
import { createCompany, createUser, type TestCompany, withDb } from '../support/fixtures.js';
import { type Api, apiAs, createJob, createSite, insertRecordedJob, siteWrite } from '../support/records.js';
import { bearer, type Session, signIn } from '../support/session.js';

// ConfigModule reads the environment when AppModule is imported (dynamically, in beforeAll): the packet
// worker runs in this app so that the last test can render a packet.
Object.assign(process.env, { PACKET_WORKER_IN_API: 'true', QUEUE_POLL_INTERVAL_SECONDS: '0.5' });

type Who = 'admin' | 'office' | 'lead' | 'tech' | 'homeowner' | 'strayHomeowner' | 'otherAdmin';

interface XmlElement {
  getAttribute(name: string): string | null;
  textContent: string | null;
  querySelectorAll(selector: string): ArrayLike<XmlElement>;
  querySelector(selector: string): XmlElement | null;
  tagName: string;
}
interface XmlDocument {
  documentElement: XmlElement;
  getElementsByTagName(name: string): { length: number };
  querySelectorAll(selector: string): ArrayLike<XmlElement>;
  querySelector(selector: string): XmlElement | null;
}

/** Every file under `root`, as paths relative to it. */
async function listFiles(root: string): Promise<string[]> {
  const entries = await readdir(root, { recursive: true, withFileTypes: true }).catch(() => []);
  return entries.filter((e) => e.isFile()).map((e) => relative(root, join(e.parentPath, e.name))).sort();
}

const CALIBRATION = { a: { x: 10, y: 20 }, b: { x: 110, y: 20 }, distanceM: 5 };

describe('site-plan image and job drawings', () => {
  let app: NestExpressApplication;
  let root: string;
  let a: TestCompany;
  let b: TestCompany;
  const sessions = {} as Record<Who, Session>;
  const as = {} as Record<Who, Api>;
  let parseXml: (text: string) => XmlDocument;

  /** The site's version straight from the database (another company cannot read it), for If-Match. */
  const siteVersion = (siteId: string) =>
    withDb(async (db) => (await db.query('select version from sites where id = $1', [siteId])).rows[0]?.version as number);
  const ifMatch = async (siteId: string) => ({ 'If-Match': `"${await siteVersion(siteId)}"` });

  /** Uploads on top of the site's current version (site writes name it: If-Match). */
  const put = async (who: Who, siteId: string, content: Buffer, field = 'file') =>
    request(app.getHttpServer())
      .put(`/api/sites/${siteId}/plan-image`)
      .set(bearer(sessions[who]))
      .set(await ifMatch(siteId))
      .attach(field, content, { filename: 'plan.bin', contentType: 'application/octet-stream' });

  /** A site where the company's crew lead leads an open job (a lead may change only such a site's plan). */
  const leadsSite = async () => {
    const { siteId } = await createSite(as.office);
    await createJob(as.office, siteId, { crewLeadUserId: a.users.lead.id });
    return { siteId };
  };

  const get = (who: Who, path: string) => request(app.getHttpServer()).get(path).set(bearer(sessions[who]));

  const siteRow = (siteId: string) =>
    withDb(async (db) => (await db.query('select plan_image_ref, plan_image_width_px, plan_cal_distance_m from sites where id = $1', [siteId])).rows[0]);

  function parseSvg(svg: string): XmlDocument {
    const doc = parseXml(svg);
    expect(doc.getElementsByTagName('parsererror').length, 'SVG is not well-formed XML').toBe(0);
    expect(doc.documentElement.tagName).toBe('svg');
    expect(doc.documentElement.getAttribute('viewBox')).toMatch(/^0 0 [\d.]+ [\d.]+$/);
    return doc;
  }

  /** All the text of a drawing, lines joined by spaces (long labels are wrapped onto several lines). */
  const textOf = (doc: XmlDocument) =>
    Array.from(doc.querySelectorAll('text'))
      .map((t) => t.textContent ?? '')
      .join(' ');

  beforeAll(async () => {
    const moduleName: string = 'jsdom';
    const { JSDOM } = (await import(moduleName)) as {
      JSDOM: new (html: string) => { window: { DOMParser: new () => { parseFromString(t: string, type: string): XmlDocument } } };
    };
    const parser = new new JSDOM('').window.DOMParser();
    parseXml = (text) => parser.parseFromString(text, 'image/svg+xml');

    root = await mkdtemp(join(tmpdir(), 'loamline-plan-image-'));
    const { createTestApp } = await import('../support/test-app.js');
    app = await createTestApp({ override: (builder) => builder.overrideProvider(OBJECT_STORAGE).useValue(new DiskStorage(root)) });
    a = await createCompany('Plan Image A');
    b = await createCompany('Plan Image B');
    for (const role of ['admin', 'office', 'lead', 'tech', 'homeowner'] as const) sessions[role] = await signIn(app, a.users[role]);
    sessions.strayHomeowner = await signIn(app, await createUser(a.id, 'homeowner'));
    sessions.otherAdmin = await signIn(app, b.users.admin);
    for (const who of Object.keys(sessions) as Who[]) as[who] = apiAs(app, sessions[who]);
  });

  afterAll(async () => {
    await app?.close();
    if (root) await rm(root, { recursive: true, force: true });
  });

  describe('PUT /api/sites/:siteId/plan-image', () => {
    it('should store a PNG as PNG, report its size and serve it back with a revalidated ETag', async () => {
      const { siteId } = await createSite(as.office);
      const png = await makePng(640, 480);
      const res = await put('office', siteId, png);
      expect(res.status, JSON.stringify(res.body)).toBe(200);
      expect(res.body.planImage).toMatchObject({ widthPx: 640, heightPx: 480, contentType: 'image/png' });
      expect(res.body.planImage.url).toMatch(new RegExp(`^/api/sites/${siteId}/plan-image\\?v=[0-9a-f]{12}$`));
      expect(res.body.wasCalibrationCleared).toBe(false);
      expect(res.body).not.toHaveProperty('planImageRef');

      const files = (await listFiles(root)).filter((f) => f.includes(siteId));
      expect(files).toHaveLength(2);
      expect(files.some((f) => f.endsWith('/plan.png'))).toBe(true);
      expect(files.some((f) => f.endsWith('/screen.jpg'))).toBe(true);

      const image = await get('lead', res.body.planImage.url).buffer(true);
      expect(image.status).toBe(200);
      expect(image.headers['content-type']).toBe('image/png');
      expect(image.headers['cache-control']).toBe('private, max-age=0, must-revalidate');
      const etag = image.headers.etag as string;
      expect(etag).toMatch(/^".+"$/);
      expect(await sharp(image.body as Buffer).metadata()).toMatchObject({ format: 'png', width: 640, height: 480 });
      const again = await get('tech', `/api/sites/${siteId}/plan-image`).set('If-None-Match', etag);
      expect(again.status).toBe(304);
    });

    it('should store a JPEG upright without its metadata, and a WebP as JPEG', async () => {
      const { siteId } = await leadsSite();
      // Stored 400×300 with EXIF orientation 6 (a phone held upright): 300×400 once turned.
      const photo = await makeFieldPhoto({ width: 400, height: 300, isNoisy: false });
      const res = await put('lead', siteId, photo);
      expect(res.status, JSON.stringify(res.body)).toBe(200);
      expect(res.body.planImage).toMatchObject({ widthPx: 300, heightPx: 400, contentType: 'image/jpeg' });
      const image = (await get('office', `/api/sites/${siteId}/plan-image`).buffer(true)).body as Buffer;
      const metadata = await sharp(image).metadata();
      expect(metadata).toMatchObject({ format: 'jpeg', width: 300, height: 400 });
      expect(metadata.orientation ?? 1).toBe(1);
      expect(await exifr.parse(image, { gps: true }).catch(() => undefined)).toBeFalsy();

      const webp = await put('admin', siteId, await makeWebp(120, 90));
      expect(webp.status, JSON.stringify(webp.body)).toBe(200);
      expect(webp.body.planImage).toMatchObject({ widthPx: 120, heightPx: 90, contentType: 'image/jpeg' });
    });

    it('should bring the longest side down to 4000 px', async () => {
      const { siteId } = await createSite(as.office);
      const res = await put('office', siteId, await makePng(5000, 1000));
      expect(res.status, JSON.stringify(res.body)).toBe(200);
      expect(res.body.planImage).toMatchObject({ widthPx: 4000, heightPx: 800 });
    });

    it.each([
      ['a HEIC photo', () => makeHeicHeader(), 415, 'HEIC_NOT_SUPPORTED'],
      ['bytes that are no image', () => Buffer.from('%PDF-1.7 not a site plan at all'), 415, 'UNSUPPORTED_IMAGE_TYPE'],
      ['a decompression bomb (400 megapixels in a few bytes)', () => makePixelBombPng(), 413, 'IMAGE_TOO_MANY_PIXELS'],
      ['a file over 20 MB', () => Buffer.concat([Buffer.from([0xff, 0xd8, 0xff]), Buffer.alloc(20 * 1024 * 1024)]), 413, 'FILE_TOO_LARGE'],
    ] as const)('should refuse %s naming the field, and store nothing', async (_name, make, status, code) => {
      const { siteId } = await createSite(as.office);
      await put('office', siteId, await makePng(200, 100));
      await siteWrite(as.office, 'patch', siteId, '', { planCalibration: CALIBRATION });
      // This company's files only: this app's packet worker may finish a packet another spec file queued.
      const companyFiles = async () => (await listFiles(root)).filter((f) => f.startsWith(`companies/${a.id}/`));
      const before = { files: await companyFiles(), row: await siteRow(siteId) };
      const res = await put('office', siteId, await make());
      expect(res.status, JSON.stringify(res.body)).toBe(status);
      expect(res.body.code).toBe(code);
      expect(res.body.issues).toEqual([expect.objectContaining({ path: 'file' })]);
      expect(res.body.message).toMatch(/^file: /);
      expect(await companyFiles()).toEqual(before.files);
      expect(await siteRow(siteId)).toEqual(before.row);
    });

    it('should answer 400 naming `file` when no file is sent', async () => {
      const { siteId } = await createSite(as.office);
      const res = await request(app.getHttpServer())
        .put(`/api/sites/${siteId}/plan-image`)
        .set(bearer(sessions.office))
        .set(await ifMatch(siteId))
        .field('note', 'x');
      expect(res.status).toBe(400);
      expect(res.body.issues[0].path).toBe('file');
      const wrongField = await put('office', siteId, await makePng(), 'image');
      expect(wrongField.status).toBe(400);
      expect(wrongField.body.issues[0].path).toBe('file');
    });

    it('should clear the calibration when the image is replaced, say so, and delete the old files', async () => {
      const { siteId } = await leadsSite();
      const first = await put('office', siteId, await makePng(300, 200));
      const calibrated = await siteWrite(as.office, 'patch', siteId, '', { planCalibration: CALIBRATION });
      expect(calibrated.planCalibration).toEqual(CALIBRATION);
      const oldFiles = (await listFiles(root)).filter((f) => f.includes(siteId));

      const second = await put('lead', siteId, await makePng(320, 200));
      expect(second.status, JSON.stringify(second.body)).toBe(200);
      expect(second.body).toMatchObject({ planCalibration: null, wasCalibrationCleared: true, planImage: { widthPx: 320 } });
      expect(second.body.planImage.url).not.toBe(first.body.planImage.url);
      const newFiles = (await listFiles(root)).filter((f) => f.includes(siteId));
      expect(newFiles).toHaveLength(2);
      expect(newFiles.filter((f) => oldFiles.includes(f))).toEqual([]);
    });

    it('should remove the image and its calibration with DELETE', async () => {
      const { siteId } = await leadsSite();
      await put('office', siteId, await makePng(300, 200));
      await siteWrite(as.office, 'patch', siteId, '', { planCalibration: CALIBRATION });
      const removed = await siteWrite(as.lead, 'delete', siteId, '/plan-image');
      expect(removed).toMatchObject({ planImage: null, planCalibration: null });
      expect((await listFiles(root)).filter((f) => f.includes(siteId))).toEqual([]);
      expect((await get('office', `/api/sites/${siteId}/plan-image`)).status).toBe(404);
      expect((await as.office.send('delete', `/api/sites/${siteId}/plan-image`, undefined, await ifMatch(siteId))).status).toBe(404);
    });

    it('should keep the image to the company, and to homeowners linked to the site', async () => {
      const { siteId } = await createSite(as.office);
      await as.office.expectOk('post', `/api/sites/${siteId}/homeowners`, { userId: a.users.homeowner.id });
      const png = await makePng(100, 100);
      expect((await put('tech', siteId, png)).status).toBe(403);
      expect((await put('homeowner', siteId, png)).status).toBe(403);
      expect((await put('otherAdmin', siteId, png)).status).toBe(404);
      expect((await put('office', siteId, png)).status).toBe(200);
      expect((await get('homeowner', `/api/sites/${siteId}/plan-image`)).status).toBe(200);
      expect((await get('strayHomeowner', `/api/sites/${siteId}/plan-image`)).status).toBe(404);
      expect((await get('otherAdmin', `/api/sites/${siteId}/plan-image`)).status).toBe(404);
      expect((await as.otherAdmin.send('delete', `/api/sites/${siteId}/plan-image`, undefined, await ifMatch(siteId))).status).toBe(404);
      expect((await as.otherAdmin.send('patch', `/api/sites/${siteId}`, { planCalibration: CALIBRATION }, await ifMatch(siteId))).status).toBe(404);
    });
  });

  describe('PATCH /api/sites/:id', () => {
    it('should refuse a calibration while the site has no image, naming planCalibration', async () => {
      const { siteId } = await createSite(as.office);
      const res = await as.office.send('patch', `/api/sites/${siteId}`, { planCalibration: CALIBRATION }, await ifMatch(siteId));
      expect(res.status).toBe(400);
      expect(res.body.issues[0].path).toBe('planCalibration');
      expect((await siteRow(siteId)).plan_cal_distance_m).toBeNull();
    });

    it('should refuse calibration points outside the image, and setting planImageRef by hand', async () => {
      const { siteId } = await createSite(as.office);
      await put('office', siteId, await makePng(200, 100));
      const outside = await as.office.send('patch', `/api/sites/${siteId}`, { planCalibration: { ...CALIBRATION, b: { x: 150, y: 101 } } }, await ifMatch(siteId));
      expect(outside.status).toBe(400);
      expect(outside.body.issues[0].path).toBe('planCalibration.b');
      const byHand = await as.office.send('patch', `/api/sites/${siteId}`, { planImageRef: 'companies/x/plan.png' }, await ifMatch(siteId));
      expect(byHand.status).toBe(400);
      expect(byHand.body.issues[0].path).toBe('planImageRef');
      const onCreate = await as.office.send('post', '/api/sites', {
        customerId: (await as.office.expectOk('get', `/api/sites/${siteId}`)).customer.id,
        label: 'X',
        addressLine1: '1 Nowhere Row',
        city: 'Nowhereton',
        country: 'Testland',
        planCalibration: CALIBRATION,
      });
      expect(onCreate.status).toBe(400);
      expect(onCreate.body.issues[0].path).toBe('planCalibration');
      // North stays settable as before.
      expect((await siteWrite(as.office, 'patch', siteId, '', { northAzimuthDeg: 15 })).northAzimuthDeg).toBe(15);
    });

    it("should let a crew lead set the plan's calibration and north, and nothing else of the site", async () => {
      const { siteId } = await leadsSite();
      await put('lead', siteId, await makePng(300, 200));
      const framed = await siteWrite(as.lead, 'patch', siteId, '', { planCalibration: CALIBRATION, northAzimuthDeg: -20 });
      expect(framed.planCalibration).toEqual(CALIBRATION);
      expect(framed.northAzimuthDeg).toBe(-20);
      const before = await siteRow(siteId);
      const refused = await as.lead.send('patch', `/api/sites/${siteId}`, { northAzimuthDeg: 5, label: 'Renamed' }, await ifMatch(siteId));
      expect(refused.status).toBe(403);
      expect(refused.body.issues.map((i: { path: string }) => i.path)).toEqual(['label']);
      // Refused whole: north did not change either.
      expect(await siteRow(siteId)).toEqual(before);
      expect((await as.tech.send('patch', `/api/sites/${siteId}`, { northAzimuthDeg: 5 }, await ifMatch(siteId))).status).toBe(403);
    });
  });

  describe('job drawings', () => {
    let jobId: string;
    let siteId: string;
    let ids: Map<string, string>;

    beforeAll(async () => {
      ({ siteId } = await createSite(as.office, DEMO_AS_BUILT.site));
      const job = await insertRecordedJob(a, siteId, { crewLeadUserId: a.users.lead.id, technicianUserIds: [] }, DEMO_AS_BUILT);
      jobId = job.id;
      ids = job.ids;
    });

    const svgOf = async (who: Who, path: string) => {
      const res = await get(who, path).buffer(true).parse((r, done) => {
        let text = '';
        r.setEncoding('utf8');
        r.on('data', (chunk: string) => (text += chunk));
        r.on('end', () => done(null, text));
      });
      return res;
    };

    const checkSvgHeaders = (res: request.Response) => {
      expect(res.status, String(res.body)).toBe(200);
      expect(res.headers['content-type']).toBe('image/svg+xml; charset=utf-8');
      expect(res.headers['content-security-policy']).toBe("default-src 'none'; style-src 'unsafe-inline'; img-src data:");
    };

    it('should draw the site plan with every item label, in the units and paper asked for', async () => {
      const res = await svgOf('tech', `/api/jobs/${jobId}/drawings/site-plan.svg`);
      checkSvgHeaders(res);
      const doc = parseSvg(res.body as string);
      const text = textOf(doc);
      for (const item of DEMO_AS_BUILT.items) expect(text).toContain(item.label);
      expect(doc.documentElement.getAttribute('width')).toBe('7.5in');
      expect(doc.querySelector('image')).toBeNull();
      expect(text).toMatch(/min depth \d+(\.\d)? cm/);

      const a4 = parseSvg((await svgOf('office', `/api/jobs/${jobId}/drawings/site-plan.svg?paper=a4&units=imperial`)).body as string);
      expect(a4.documentElement.getAttribute('width')).toMatch(/mm$/);
      // Depths to 1/8 in, never the drafter's 26'-3" (one style of feet and inches everywhere).
      expect(textOf(a4)).toMatch(/min depth \d+( \d\/\d)? in/);
      expect(textOf(a4)).not.toMatch(/\d+'-\d+"/);
    });

    it('should turn layers off, and answer 400 naming `layers` for an unknown one', async () => {
      const off = parseSvg((await svgOf('lead', `/api/jobs/${jobId}/drawings/site-plan.svg?layers=labels,reference-points`)).body as string);
      expect(off.querySelectorAll('[data-label-for]').length).toBe(0);
      expect(off.querySelectorAll('[data-kind="reference_point"]').length).toBe(0);
      expect(off.querySelectorAll('[data-accuracy-for]').length).toBe(0);
      const on = parseSvg((await svgOf('lead', `/api/jobs/${jobId}/drawings/site-plan.svg`)).body as string);
      expect(on.querySelectorAll('[data-accuracy-for]').length).toBeGreaterThan(0);

      const bad = await get('lead', `/api/jobs/${jobId}/drawings/site-plan.svg?layers=labels,trees`);
      expect(bad.status).toBe(400);
      expect(bad.body.issues[0].path).toBe('layers');
      expect(bad.body.issues[0].message).toContain('"trees"');
      const badUnits = await get('lead', `/api/jobs/${jobId}/drawings/schematic.svg?units=cubits`);
      expect(badUnits.status).toBe(400);
      expect(badUnits.body.issues[0].path).toBe('units');
    });

    it('should put the calibrated plan image underneath as a small data: URL', async () => {
      await put('office', siteId, await makePng(3000, 2000));
      const uncalibrated = parseSvg((await svgOf('office', `/api/jobs/${jobId}/drawings/site-plan.svg`)).body as string);
      expect(uncalibrated.querySelector('image'), 'an image without calibration cannot be placed').toBeNull();

      await siteWrite(as.office, 'patch', siteId, '', { planCalibration: { a: { x: 100, y: 1900 }, b: { x: 2900, y: 1900 }, distanceM: 28 } });
      const res = await svgOf('office', `/api/jobs/${jobId}/drawings/site-plan.svg`);
      const image = parseSvg(res.body as string).querySelector('image');
      const href = image?.getAttribute('href') ?? '';
      expect(href).toMatch(/^data:image\/jpeg;base64,/);
      const embedded = await sharp(Buffer.from(href.slice(href.indexOf(',') + 1), 'base64')).metadata();
      expect(Math.max(embedded.width ?? 0, embedded.height ?? 0)).toBeLessThanOrEqual(2000);
      // 28 m between points 2800 px apart: 0.01 m per pixel, so the 3000 px image spans 30 m of plan.
      // At the sheet's scale (data-ratio, e.g. 192 for 1:192) that is 30 m × 72 pt/in ÷ 0.0254 m/in ÷ ratio.
      const svg = parseSvg(res.body as string);
      const ratio = Number(svg.querySelector('[data-role="scale"]')?.getAttribute('data-ratio'));
      expect(Number(image?.getAttribute('width'))).toBeCloseTo((30 * 72) / 0.0254 / ratio, 0);
    });

    it('should draw the schematic and each depth profile', async () => {
      const schematic = await svgOf('tech', `/api/jobs/${jobId}/drawings/schematic.svg`);
      checkSvgHeaders(schematic);
      const text = textOf(parseSvg(schematic.body as string));
      for (const item of DEMO_AS_BUILT.items) expect(text.replace(/\s+/g, ' ')).toContain(item.label);

      const runId = ids.get('run-p2')!;
      const profile = await svgOf('lead', `/api/jobs/${jobId}/drawings/runs/${runId}/depth-profile.svg?units=metric`);
      checkSvgHeaders(profile);
      expect(textOf(parseSvg(profile.body as string))).toContain('Patio splice to P2');
      expect((await get('lead', `/api/jobs/${jobId}/drawings/runs/${ids.get('amp-1')}/depth-profile.svg`)).status).toBe(404);
    });

    it('should print the calibrated plan image under the packet’s site plan', async () => {
      // The site is calibrated by the test above; the job goes straight to ready to issue.
      await withDb((db) => db.query(`update jobs set status = 'ready_to_issue' where id = $1`, [jobId]));
      const { version } = await as.office.expectOk('get', `/api/jobs/${jobId}`);
      const issued = await as.office.expectOk('post', `/api/jobs/${jobId}/packets`, undefined, { 'If-Match': `"${version}"` });
      const deadline = Date.now() + 120_000;
      let packet = issued;
      while (packet.status !== 'ready' && packet.status !== 'failed' && Date.now() < deadline) {
        await new Promise((resolve) => setTimeout(resolve, 300));
        packet = await as.office.expectOk('get', `/api/packets/${issued.id}`);
      }
      expect(packet).toMatchObject({ status: 'ready', failureReason: null });
      const zip = await get('office', `/api/packets/${issued.id}/archive.zip`)
        .buffer(true)
        .parse((response, callback) => {
          const chunks: Buffer[] = [];
          response.on('data', (c: Buffer) => chunks.push(c));
          response.on('end', () => callback(null, Buffer.concat(chunks)));
        });
      expect(zip.status).toBe(200);
      const dir = mkdtempSync(join(tmpdir(), 'plan-image-packet-'));
      writeFileSync(join(dir, 'archive.zip'), zip.body as Buffer);
      const sitePlan = execFileSync('unzip', ['-p', 'archive.zip', 'site-plan.svg'], { cwd: dir, encoding: 'utf8', maxBuffer: 64 * 1024 * 1024 });
      const image = parseSvg(sitePlan).querySelector('image');
      expect(image?.getAttribute('data-layer')).toBe('plan-image');
      expect(image?.getAttribute('href')).toMatch(/^data:image\/jpeg;base64,/);
      await rm(dir, { recursive: true, force: true });
    }, 150_000);

    it('should keep drawings to the company (404 for another company)', async () => {
      for (const path of ['site-plan.svg', 'schematic.svg', `runs/${ids.get('run-p2')}/depth-profile.svg`]) {
        expect((await get('otherAdmin', `/api/jobs/${jobId}/drawings/${path}`)).status).toBe(404);
        expect((await get('homeowner', `/api/jobs/${jobId}/drawings/${path}`)).status).toBe(403);
      }
    });
  });
});
