import { request as httpRequest } from 'node:http';
import type { AddressInfo } from 'node:net';
import { mkdtemp, readdir, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

import type { NestExpressApplication } from '@nestjs/platform-express';
import sharp from 'sharp';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { UploadSlots } from '../../api/src/common/image-work.js';
import { DiskStorage } from '../../api/src/storage/disk-storage.js';
import { OBJECT_STORAGE } from '../../api/src/storage/object-storage.js';
import { makePixelBombPng, makePng } from '../fixtures/photos/make-photos.js';
import { createCompany, type TestCompany } from '../support/fixtures.js';
import { type Api, apiAs, createJob, createSite, type JobFixture, moveJob } from '../support/records.js';
import { bearer, type Session, signIn } from '../support/session.js';

/**
 * Issue 18 §1: tiny images that cost seconds of CPU. A 153-byte PNG of 1×2400 pixels passed the area
 * check and its thumbnail was scaled up to ~245 MP before cropping. Images are now refused by each side
 * and by aspect ratio as well as by area (photos and the site plan alike), the derivatives are never
 * enlarged, and one user may have only UPLOAD_MAX_CONCURRENT_PER_USER uploads in flight.
 */
const ENV = { UPLOAD_MAX_CONCURRENT_PER_USER: '1' };
const saved = Object.fromEntries(Object.keys(ENV).map((key) => [key, process.env[key]]));

/** A real, decodable PNG of one colour: a thin strip is a few hundred bytes. */
const strip = (width: number, height: number) =>
  sharp({ create: { width, height, channels: 3, background: { r: 200, g: 90, b: 20 } } })
    .png()
    .toBuffer();

describe('image limits and upload concurrency', () => {
  let app: NestExpressApplication;
  let root: string;
  let company: TestCompany;
  let lead: Session;
  let tech: Session;
  let office: Session;
  let as: { office: Api; lead: Api };
  let siteId: string;

  const uploadPhoto = (session: Session, job: JobFixture, content: Buffer, name = 'strip.png') =>
    request(app.getHttpServer())
      .post(`/api/jobs/${job.id}/photos`)
      .set(bearer(session))
      .set('If-Match', `"${job.version}"`)
      .attach('files', content, { filename: name, contentType: 'image/png' });

  const putPlan = async (content: Buffer) => {
    const site = await as.office.expectOk('get', `/api/sites/${siteId}`);
    return request(app.getHttpServer())
      .put(`/api/sites/${siteId}/plan-image`)
      .set(bearer(office))
      .set('If-Match', `"${site.version ?? 1}"`)
      .attach('file', content, { filename: 'plan.png', contentType: 'image/png' });
  };

  /** This company's stored files (this app's packet worker may finish a packet another spec file queued, under its company). */
  const storedFiles = async () => (await readdir(join(root, 'companies', company.id), { recursive: true }).catch(() => [])).length;

  async function jobInProgress(): Promise<JobFixture> {
    const job = await createJob(as.office, siteId, { crewLeadUserId: company.users.lead.id, technicianUserIds: [company.users.tech.id] });
    return moveJob(as.office, job, 'in_progress');
  }

  beforeAll(async () => {
    Object.assign(process.env, ENV);
    root = await mkdtemp(join(tmpdir(), 'loamline-image-limits-'));
    const { createTestApp } = await import('../support/test-app.js');
    app = await createTestApp({ override: (builder) => builder.overrideProvider(OBJECT_STORAGE).useValue(new DiskStorage(root)) });
    company = await createCompany('Image Limits Co');
    lead = await signIn(app, company.users.lead);
    tech = await signIn(app, company.users.tech);
    office = await signIn(app, company.users.office);
    as = { office: apiAs(app, office), lead: apiAs(app, lead) };
    siteId = (await createSite(as.office)).siteId;
    // The whole app is imported and started here: allow for a machine loaded by other suites.
  }, 300_000);

  afterAll(async () => {
    await app?.close();
    if (root) await rm(root, { recursive: true, force: true });
    for (const [key, value] of Object.entries(saved)) {
      if (value === undefined) delete process.env[key];
      else process.env[key] = value;
    }
  });

  describe('a photo', () => {
    it.each([
      // The probe's files: 1×2400 and 2400×1 (a few hundred bytes each) cost 13–20 s of CPU.
      ['1×2400 pixels', () => strip(1, 2400), 422, 'IMAGE_TOO_ELONGATED', /1×2,400 pixels, 2400 times as long as it is wide; at most 10:1 .*UPLOAD_MAX_ASPECT_RATIO/],
      ['2400×1 pixels', () => strip(2400, 1), 422, 'IMAGE_TOO_ELONGATED', /UPLOAD_MAX_ASPECT_RATIO/],
      // 1×20,000,000 is only 20 MP, under the area limit: refused by its side (header only, never decoded).
      ['1×20,000,000 pixels', async () => makePixelBombPng(1, 20_000_000), 413, 'IMAGE_SIDE_TOO_LONG', /no side may be longer than 20,000 pixels \(UPLOAD_MAX_IMAGE_SIDE_PX\)/],
      ['25,000×4,000 pixels (a side too long, a sane ratio)', async () => makePixelBombPng(25_000, 4000), 413, 'IMAGE_SIDE_TOO_LONG', /UPLOAD_MAX_IMAGE_SIDE_PX/],
      ['20,000×20,000 pixels (area)', async () => makePixelBombPng(20_000, 20_000), 413, 'IMAGE_TOO_MANY_PIXELS', /UPLOAD_MAX_INPUT_PIXELS/],
    ] as const)('of %s is refused naming the file and the limit, and nothing is stored', async (_name, make, status, code, message) => {
      const job = await jobInProgress();
      const before = await storedFiles();
      const res = await uploadPhoto(lead, job, await make(), 'hostile.png');
      expect(res.status, JSON.stringify(res.body)).toBe(status);
      expect(res.body.code).toBe(code);
      expect(res.body.message).toMatch(/^files\[0\] "hostile\.png" is /);
      expect(res.body.message).toMatch(message);
      expect(await storedFiles()).toBe(before);
    });

    it('at the largest accepted ratio is stored, and no derivative is larger than the original', async () => {
      const job = await jobInProgress();
      const res = await uploadPhoto(lead, job, await strip(40, 400));
      expect(res.status, JSON.stringify(res.body)).toBe(201);
      const [photo] = res.body.photos as { width: number; height: number; derivatives: Record<string, { width: number; height: number }> }[];
      expect(photo).toMatchObject({ width: 40, height: 400 });
      // Before the fix the 320×320 thumbnail was cut from a copy enlarged to 320×3200.
      expect(photo!.derivatives.thumb).toEqual(expect.objectContaining({ width: 40, height: 320 }));
      expect(photo!.derivatives.screen).toEqual(expect.objectContaining({ width: 40, height: 400 }));
      expect(photo!.derivatives.print).toEqual(expect.objectContaining({ width: 40, height: 400 }));
    });
  });

  describe('a site-plan image', () => {
    it.each([
      ['1×2400 pixels', () => strip(1, 2400), 422, 'IMAGE_TOO_ELONGATED', /UPLOAD_MAX_ASPECT_RATIO/],
      ['1×20,000,000 pixels', async () => makePixelBombPng(1, 20_000_000), 413, 'IMAGE_SIDE_TOO_LONG', /UPLOAD_MAX_IMAGE_SIDE_PX/],
    ] as const)('of %s is refused naming the field and the limit', async (_name, make, status, code, message) => {
      const res = await putPlan(await make());
      expect(res.status, JSON.stringify(res.body)).toBe(status);
      expect(res.body.code).toBe(code);
      expect(res.body.issues).toEqual([expect.objectContaining({ path: 'file' })]);
      expect(res.body.message).toMatch(/^file: the image is /);
      expect(res.body.message).toMatch(message);
    });

    it('at a 10:1 ratio is stored', async () => {
      const res = await putPlan(await makePng(1000, 100));
      expect(res.status, JSON.stringify(res.body)).toBe(200);
      expect(res.body.planImage).toMatchObject({ widthPx: 1000, heightPx: 100 });
    });
  });

  it('should answer 429 with Retry-After to a second upload of the same user while the first is in flight', async () => {
    const job = await jobInProgress();
    const server = app.getHttpServer();
    if (!server.listening) await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
    const { port } = server.address() as AddressInfo;
    const slots = app.get(UploadSlots);
    const userId = company.users.lead.id;

    // The first upload sends its headers and part of its body, then waits: the server has taken the slot.
    const boundary = 'loamline-slow-upload';
    const photo = await strip(64, 48);
    const head = `--${boundary}\r\nContent-Disposition: form-data; name="files"; filename="slow.png"\r\nContent-Type: image/png\r\n\r\n`;
    const tail = `\r\n--${boundary}--\r\n`;
    const slow = httpRequest({
      host: '127.0.0.1',
      port,
      method: 'POST',
      path: `/api/jobs/${job.id}/photos`,
      headers: {
        ...bearer(lead),
        'If-Match': `"${job.version}"`,
        'Content-Type': `multipart/form-data; boundary=${boundary}`,
        'Content-Length': String(Buffer.byteLength(head) + photo.length + Buffer.byteLength(tail)),
      },
    });
    const slowAnswer = new Promise<{ status: number; body: string }>((resolve, reject) => {
      slow.on('response', (res) => {
        let body = '';
        res.on('data', (chunk: Buffer) => (body += chunk.toString()));
        res.on('end', () => resolve({ status: res.statusCode ?? 0, body }));
      });
      slow.on('error', reject);
    });
    slow.write(head);
    slow.write(photo.subarray(0, 10));
    for (let i = 0; i < 200 && slots.countOf(userId) < 1; i += 1) await new Promise((r) => setTimeout(r, 25));
    expect(slots.countOf(userId)).toBe(1);

    const refused = await uploadPhoto(lead, job, await strip(64, 48));
    expect(refused.status, JSON.stringify(refused.body)).toBe(429);
    expect(refused.headers['retry-after']).toBe('5');
    expect(refused.body).toMatchObject({ statusCode: 429, code: 'TOO_MANY_UPLOADS' });
    expect(refused.body.message).toMatch(/UPLOAD_MAX_CONCURRENT_PER_USER/);
    // The site-plan upload counts against the same allowance.
    const site = await as.office.expectOk('get', `/api/sites/${siteId}`);
    const plan = await request(server)
      .put(`/api/sites/${siteId}/plan-image`)
      .set(bearer(lead))
      .set('If-Match', `"${site.version ?? 1}"`)
      .attach('file', await makePng(100, 100), { filename: 'plan.png', contentType: 'image/png' });
    expect(plan.status).toBe(429);

    // Another user is not held back by this one.
    const other = await uploadPhoto(tech, job, await strip(64, 48));
    expect(other.status, JSON.stringify(other.body)).toBe(201);

    // The first upload finishes (its version is stale by now: 412); the slot is given back either way.
    slow.end(Buffer.concat([photo.subarray(10), Buffer.from(tail)]));
    const first = await slowAnswer;
    expect([201, 412]).toContain(first.status);
    expect(slots.countOf(userId)).toBe(0);
    const version = (await as.office.expectOk('get', `/api/jobs/${job.id}`)).version as number;
    expect((await uploadPhoto(lead, { ...job, version }, await strip(64, 48))).status).toBe(201);
  });
});
