import { createHash } from 'node:crypto';
import { mkdtemp, readdir, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join, relative } from 'node:path';

import type { NestExpressApplication } from '@nestjs/platform-express';
import exifr from 'exifr';
import sharp from 'sharp';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { DiskStorage } from '../../api/src/storage/disk-storage.js';
import { OBJECT_STORAGE } from '../../api/src/storage/object-storage.js';
import { makeFieldPhoto, makeHeicHeader, makePixelBombPng, makePng, makeWebp } from '../fixtures/photos/make-photos.js';
import { createCompany, type TestCompany, withDb } from '../support/fixtures.js';
import { type Api, apiAs, createJob, createSite, type JobFixture, moveJob } from '../support/records.js';
import { bearer, type Session, signIn } from '../support/session.js';
import { createTestApp } from '../support/test-app.js';

interface FilePart {
  content: Buffer;
  name: string;
  contentType?: string;
}

type Who = 'admin' | 'office' | 'lead' | 'tech' | 'homeowner' | 'otherAdmin' | 'strayTech';

/** Every file under `root`, as paths relative to it. */
async function listFiles(root: string): Promise<string[]> {
  const entries = await readdir(root, { recursive: true, withFileTypes: true }).catch(() => []);
  return entries.filter((e) => e.isFile()).map((e) => relative(root, join(e.parentPath, e.name))).sort();
}

describe('photos (upload, processing, storage, soft delete)', () => {
  let app: NestExpressApplication;
  let root: string;
  let a: TestCompany;
  let b: TestCompany;
  const sessions = {} as Record<Who, Session>;
  const as = {} as Record<Who, Api>;
  let siteId: string;
  let field12mp: Buffer;

  async function jobInProgress(): Promise<JobFixture> {
    const job = await createJob(as.office, siteId, { crewLeadUserId: a.users.lead.id, technicianUserIds: [a.users.tech.id] });
    return moveJob(as.office, job, 'in_progress');
  }

  function upload(
    who: Who,
    jobId: string,
    version: number | undefined,
    files: FilePart[],
    fields: Record<string, string | string[]> = {},
  ) {
    let req = request(app.getHttpServer()).post(`/api/jobs/${jobId}/photos`).set(bearer(sessions[who]));
    if (version !== undefined) req = req.set('If-Match', `"${version}"`);
    for (const [name, value] of Object.entries(fields)) {
      for (const v of Array.isArray(value) ? value : [value]) req = req.field(name, v);
    }
    for (const file of files) req = req.attach('files', file.content, { filename: file.name, contentType: file.contentType ?? 'image/jpeg' });
    return req;
  }

  /**
   * This company's stored files. The worker database is shared with other spec files, and this app's
   * background packet worker may finish a packet one of them queued, writing under another company's
   * folder in `root` while a test here compares snapshots.
   */
  const companyFiles = async () => (await listFiles(root)).filter((f) => f.startsWith(`companies/${a.id}/`));

  const get = (who: Who, path: string) => request(app.getHttpServer()).get(path).set(bearer(sessions[who]));

  const photoRows = (jobId: string) =>
    withDb(async (db) => (await db.query('select count(*)::int as n from photos where job_id = $1', [jobId])).rows[0].n as number);

  const jobVersion = (jobId: string) =>
    withDb(async (db) => (await db.query('select version from jobs where id = $1', [jobId])).rows[0].version as number);

  beforeAll(async () => {
    root = await mkdtemp(join(tmpdir(), 'loamline-photos-'));
    app = await createTestApp({ override: (builder) => builder.overrideProvider(OBJECT_STORAGE).useValue(new DiskStorage(root)) });
    a = await createCompany('Photos A');
    b = await createCompany('Photos B');
    for (const role of ['admin', 'office', 'lead', 'tech', 'homeowner'] as const) sessions[role] = await signIn(app, a.users[role]);
    sessions.otherAdmin = await signIn(app, b.users.admin);
    const { createUser } = await import('../support/fixtures.js');
    sessions.strayTech = await signIn(app, await createUser(a.id, 'tech'));
    for (const who of Object.keys(sessions) as Who[]) as[who] = apiAs(app, sessions[who]);
    siteId = (await createSite(as.office)).siteId;
    field12mp = await makeFieldPhoto();
  });

  afterAll(async () => {
    await app?.close();
    await rm(root, { recursive: true, force: true });
  });

  describe('a 12-megapixel JPEG with EXIF orientation 6 and GPS', () => {
    let job: JobFixture;
    let body: { photos: Record<string, any>[]; jobVersion: number; isReplay: boolean };

    beforeAll(async () => {
      job = await jobInProgress();
      const res = await upload('tech', job.id, job.version, [{ content: field12mp, name: 'IMG_0042.JPG' }], {
        caption: 'Trench at the patio, tape at 18 in',
        takenAt: '2024-05-01T17:11:12Z',
      });
      expect(res.status, JSON.stringify(res.body)).toBe(201);
      body = res.body;
    });

    it('should answer with the upright size, derivative URLs and the new job version', async () => {
      expect(body.isReplay).toBe(false);
      expect(body.jobVersion).toBe(job.version + 1);
      expect(await jobVersion(job.id)).toBe(job.version + 1);
      const [photo] = body.photos;
      expect(photo).toMatchObject({
        jobId: job.id,
        target: { type: 'job' },
        caption: 'Trench at the patio, tape at 18 in',
        takenAt: '2024-05-01T17:11:12.000Z',
        exifTakenAt: '2024-05-01T10:11:12',
        exifLocation: { lat: expect.closeTo(40.0003, 5), lon: expect.closeTo(-105.0004, 5) },
        width: 3000,
        height: 4000,
        original: { contentType: 'image/jpeg', bytes: field12mp.length, sha256: createHash('sha256').update(field12mp).digest('hex'), name: 'IMG_0042.JPG' },
        derivatives: {
          thumb: { width: 320, height: 320, contentType: 'image/webp' },
          screen: { width: 1200, height: 1600, contentType: 'image/webp' },
          print: { width: 1800, height: 2400, contentType: 'image/jpeg' },
        },
        uploadedBy: { id: a.users.tech.id },
        deletedAt: null,
      });
    });

    it('should store GPS and the EXIF time in the database', async () => {
      const row = await withDb(async (db) => (await db.query('select * from photos where id = $1', [body.photos[0]!.id])).rows[0]);
      expect(row.gps_lat).toBeCloseTo(40.0003, 5);
      expect(row.gps_lon).toBeCloseTo(-105.0004, 5);
      expect(row.company_id).toBe(a.id);
      expect(row.original_key).toBe(`companies/${a.id}/jobs/${job.id}/photos/${row.id}/original.jpg`);
    });

    it('should serve an upright print derivative of 1800×2400 with no EXIF or GPS', async () => {
      const res = await get('tech', body.photos[0]!.derivatives.print.url).buffer(true).parse((r, cb) => {
        const chunks: Buffer[] = [];
        r.on('data', (c: Buffer) => chunks.push(c));
        r.on('end', () => cb(null, Buffer.concat(chunks)));
      });
      expect(res.status).toBe(200);
      expect(res.headers['content-type']).toBe('image/jpeg');
      expect(res.headers['cache-control']).toMatch(/^private/);
      expect(res.headers.etag).toMatch(/^".+-print"$/);
      const print = res.body as Buffer;
      const meta = await sharp(print).metadata();
      expect([meta.width, meta.height]).toEqual([1800, 2400]);
      expect(meta.orientation ?? 1).toBe(1);
      expect(meta.exif).toBeUndefined();
      expect(meta.icc).toBeUndefined();
      expect(await exifr.gps(print).catch(() => undefined)).toBeUndefined();
      expect(await exifr.parse(print, { gps: true }).catch(() => undefined)).toBeUndefined();
      // The red block stored at the top-left is at the top-right once upright (rotated 90° clockwise).
      const pixel = async (left: number, top: number) => [...(await sharp(print).extract({ left, top, width: 1, height: 1 }).raw().toBuffer())];
      const [r, g] = await pixel(1800 - 20, 20);
      expect(r).toBeGreaterThan(200);
      expect(g).toBeLessThan(60);
      const [r2] = await pixel(20, 20);
      expect(r2).toBeLessThan(200);

      const again = await get('tech', body.photos[0]!.derivatives.print.url).set('If-None-Match', res.headers.etag!);
      expect(again.status).toBe(304);
    });

    it('should serve screen and thumb as metadata-free WebP of the expected sizes', async () => {
      for (const [variant, size] of [['screen', [1200, 1600]], ['thumb', [320, 320]]] as const) {
        const res = await get('lead', body.photos[0]!.derivatives[variant].url).buffer(true).parse((r, cb) => {
          const chunks: Buffer[] = [];
          r.on('data', (c: Buffer) => chunks.push(c));
          r.on('end', () => cb(null, Buffer.concat(chunks)));
        });
        expect(res.status).toBe(200);
        expect(res.headers['content-type']).toBe('image/webp');
        const meta = await sharp(res.body as Buffer).metadata();
        expect([meta.format, meta.width, meta.height]).toEqual(['webp', ...size]);
        expect(meta.exif).toBeUndefined();
      }
    });

    it('should keep the original exactly as uploaded, for staff', async () => {
      const res = await get('office', body.photos[0]!.original.url).buffer(true).parse((r, cb) => {
        const chunks: Buffer[] = [];
        r.on('data', (c: Buffer) => chunks.push(c));
        r.on('end', () => cb(null, Buffer.concat(chunks)));
      });
      expect(res.status).toBe(200);
      expect(Buffer.compare(res.body as Buffer, field12mp)).toBe(0);
      expect((await exifr.gps(res.body as Buffer))?.latitude).toBeCloseTo(40.0003, 5);
    });

    it('should list the photo with its caption and URLs, and 404 an unknown variant', async () => {
      const list = await as.lead.expectOk('get', `/api/jobs/${job.id}/photos`);
      expect(list.items.map((p: { id: string }) => p.id)).toEqual([body.photos[0]!.id]);
      expect(list.items[0].derivatives.thumb.url).toBe(`/api/photos/${body.photos[0]!.id}/thumb`);
      expect((await get('lead', `/api/photos/${body.photos[0]!.id}/huge`)).status).toBe(404);
    });
  });

  describe('refused uploads store nothing', () => {
    let job: JobFixture;
    let before: { files: string[]; rows: number };

    beforeAll(async () => {
      job = await jobInProgress();
    });
    const snapshot = async () => ({ files: await companyFiles(), rows: await photoRows(job.id) });
    const expectNothingStored = async () => {
      expect(await snapshot()).toEqual(before);
      expect(await jobVersion(job.id)).toBe(job.version);
    };

    it('should answer 415 for a text file renamed .jpg', async () => {
      before = await snapshot();
      const res = await upload('tech', job.id, job.version, [{ content: Buffer.from('these are my notes, not a photo\n'), name: 'trench.jpg' }]);
      expect(res.status).toBe(415);
      expect(res.body).toMatchObject({ code: 'UNSUPPORTED_IMAGE_TYPE', message: expect.stringContaining('JPEG') });
      await expectNothingStored();
    });

    it('should answer 415 for HEIC with a message that says how to send JPEG', async () => {
      before = await snapshot();
      const res = await upload('tech', job.id, job.version, [{ content: makeHeicHeader(), name: 'IMG_0001.HEIC', contentType: 'image/heic' }]);
      expect(res.status).toBe(415);
      expect(res.body.code).toBe('HEIC_NOT_SUPPORTED');
      expect(res.body.message).toMatch(/^files\[0\] "IMG_0001\.HEIC" is a HEIC photo.*JPEG.*most compatible/);
      expect(res.body.issues).toEqual([{ path: 'files[0]', message: 'is HEIC; send JPEG, PNG or WebP' }]);
      await expectNothingStored();
    });

    it('should answer 415 for the whole request when one of several files is not an image, storing none', async () => {
      before = await snapshot();
      const res = await upload('tech', job.id, job.version, [
        { content: await makePng(), name: 'ok.png', contentType: 'image/png' },
        { content: Buffer.from('%PDF-1.7 not a photo'), name: 'scan.png', contentType: 'image/png' },
      ]);
      expect(res.status).toBe(415);
      expect(res.body.message).toContain('files[1]');
      await expectNothingStored();
    });

    it('should answer 413 naming the limit for a file over UPLOAD_MAX_FILE_BYTES', async () => {
      before = await snapshot();
      const big = Buffer.concat([field12mp, Buffer.alloc(25 * 1024 * 1024 + 1 - field12mp.length, 7)]);
      const res = await upload('tech', job.id, job.version, [{ content: big, name: 'big.jpg' }]);
      expect(res.status).toBe(413);
      expect(res.body).toMatchObject({ code: 'FILE_TOO_LARGE', message: expect.stringContaining('25 MB') });
      expect(res.body.message).toContain('UPLOAD_MAX_FILE_BYTES');
      await expectNothingStored();
    });

    it('should answer 413 naming the limit for more than UPLOAD_MAX_FILES files', async () => {
      before = await snapshot();
      const png = await makePng();
      const res = await upload('tech', job.id, job.version, Array.from({ length: 11 }, (_, i) => ({ content: png, name: `p${i}.png`, contentType: 'image/png' })));
      expect(res.status).toBe(413);
      expect(res.body).toMatchObject({ code: 'TOO_MANY_FILES', message: expect.stringContaining('At most 10') });
      await expectNothingStored();
    });

    it('should answer 413 for an image with too many pixels (decompression bomb) without decoding it', async () => {
      before = await snapshot();
      const res = await upload('tech', job.id, job.version, [{ content: makePixelBombPng(), name: 'bomb.png', contentType: 'image/png' }]);
      expect(res.status).toBe(413);
      expect(res.body.code).toBe('IMAGE_TOO_MANY_PIXELS');
      await expectNothingStored();
    });

    it('should answer 412 on a stale version with nothing stored', async () => {
      before = await snapshot();
      const res = await upload('tech', job.id, job.version - 1, [{ content: await makeWebp(), name: 'w.webp', contentType: 'image/webp' }]);
      expect(res.status).toBe(412);
      expect(res.body).toMatchObject({ code: 'VERSION_CONFLICT', currentVersion: job.version });
      await expectNothingStored();
    });

    it('should answer 428 without If-Match, and 400 without files', async () => {
      before = await snapshot();
      expect((await upload('tech', job.id, undefined, [{ content: await makeWebp(), name: 'w.webp' }])).status).toBe(428);
      const none = await upload('tech', job.id, job.version, [], { caption: 'nothing attached' });
      expect(none.status).toBe(400);
      await expectNothingStored();
    });

    it('should refuse a homeowner (403), a technician not on the crew (403), and another company (404)', async () => {
      before = await snapshot();
      const file = [{ content: await makePng(), name: 'p.png', contentType: 'image/png' }];
      expect((await upload('homeowner', job.id, job.version, file)).status).toBe(403);
      const stray = await upload('strayTech', job.id, job.version, file);
      expect([stray.status, stray.body.code]).toEqual([403, 'NOT_ON_CREW']);
      expect((await upload('otherAdmin', job.id, job.version, file)).status).toBe(404);
      await expectNothingStored();
    });
  });

  it('should make a path-traversal file name harmless: generated keys, sanitised name only as metadata', async () => {
    const job = await jobInProgress();
    const res = await upload('lead', job.id, job.version, [
      { content: await makePng(), name: '../../../../etc/passwd.png', contentType: 'image/png' },
      { content: await makeWebp(), name: '..\\..\\windows\\win.ini', contentType: 'text/plain' },
    ]);
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.photos.map((p: { original: { name: string } }) => p.original.name)).toEqual(['passwd.png', 'win.ini']);
    expect(res.body.photos.map((p: { original: { contentType: string } }) => p.original.contentType)).toEqual(['image/png', 'image/webp']);
    const files = await listFiles(root);
    for (const photo of res.body.photos as { id: string }[]) {
      expect(files.filter((f) => f.includes(photo.id)).sort()).toEqual(
        ['original', 'print', 'screen', 'thumb'].map((v) => expect.stringMatching(new RegExp(`^companies/${a.id}/jobs/${job.id}/photos/${photo.id}/${v}\\.`))),
      );
    }
    expect(files.some((f) => f.includes('passwd') || f.includes('win.ini') || f.startsWith('..'))).toBe(false);
    expect(await listFiles(join(root, '..', 'etc')).catch(() => [])).not.toContain('passwd.png');
  });

  it('should attach photos to a run, re-assign them to an item, and refuse another job’s run', async () => {
    const job = await jobInProgress();
    const other = await jobInProgress();
    let version = job.version;
    const item = await as.lead.expectOk('post', `/api/jobs/${job.id}/items`, { kind: 'junction', label: 'Splice box' }, { 'If-Match': String(version) });
    version = item.jobVersion;
    const otherItem = await as.lead.expectOk('post', `/api/jobs/${other.id}/items`, { kind: 'junction', label: 'Elsewhere' }, { 'If-Match': String(other.version) });

    const wrong = await upload('tech', job.id, version, [{ content: await makePng(), name: 'p.png' }], {
      target: JSON.stringify({ type: 'item', id: otherItem.item.id }),
    });
    expect([wrong.status, wrong.body.issues?.[0]?.path]).toEqual([400, 'target.id']);

    const res = await upload('tech', job.id, version, [{ content: await makePng(), name: 'p.png' }], {
      target: JSON.stringify({ type: 'item', id: item.item.id }),
    });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const photo = res.body.photos[0];
    expect(photo.target).toEqual({ type: 'item', id: item.item.id });

    const patched = await as.tech.expectOk('patch', `/api/photos/${photo.id}`, { caption: 'Wall entry before sealing', target: { type: 'job' } }, { 'If-Match': String(res.body.jobVersion) });
    expect(patched.photo).toMatchObject({ caption: 'Wall entry before sealing', target: { type: 'job' } });
    expect(patched.jobVersion).toBe(res.body.jobVersion + 1);
    const stale = await as.tech.send('patch', `/api/photos/${photo.id}`, { caption: 'x' }, { 'If-Match': String(res.body.jobVersion) });
    expect(stale.status).toBe(412);
    const bad = await as.tech.send('patch', `/api/photos/${photo.id}`, { target: { type: 'item', id: otherItem.item.id } }, { 'If-Match': String(patched.jobVersion) });
    expect(bad.status).toBe(400);
  });

  it('should delete only the chosen photo (soft, with undo), leaving the job’s other photos and other jobs’ photos', async () => {
    const job = await jobInProgress();
    const other = await jobInProgress();
    const first = await upload('tech', job.id, job.version, [
      { content: await makePng(), name: 'one.png' },
      { content: await makeWebp(), name: 'two.webp' },
    ]);
    expect(first.status).toBe(201);
    const otherRes = await upload('tech', other.id, other.version, [{ content: await makePng(), name: 'three.png' }]);
    expect(otherRes.status).toBe(201);
    const [one, two] = first.body.photos as { id: string }[];
    const three = otherRes.body.photos[0] as { id: string };
    const filesBefore = await companyFiles();

    const deleted = await as.tech.expectOk('delete', `/api/photos/${one!.id}`, undefined, { 'If-Match': String(first.body.jobVersion) });
    expect(deleted.photo.deletedAt).not.toBeNull();
    expect((await as.tech.expectOk('get', `/api/jobs/${job.id}/photos`)).items.map((p: { id: string }) => p.id)).toEqual([two!.id]);
    expect((await as.tech.expectOk('get', `/api/jobs/${other.id}/photos`)).items.map((p: { id: string }) => p.id)).toEqual([three.id]);
    expect((await as.tech.expectOk('get', `/api/jobs/${job.id}/photos?includeDeleted=true`)).items).toHaveLength(2);
    expect((await get('tech', `/api/photos/${one!.id}/thumb`)).status).toBe(404);
    expect((await get('tech', `/api/photos/${two!.id}/thumb`)).status).toBe(200);
    expect((await get('tech', `/api/photos/${three.id}/thumb`)).status).toBe(200);
    // Soft delete keeps every file, so undo is complete.
    expect(await companyFiles()).toEqual(filesBefore);
    expect((await as.tech.send('delete', `/api/photos/${one!.id}`, undefined, { 'If-Match': String(deleted.jobVersion) })).status).toBe(404);

    const restored = await as.tech.expectOk('post', `/api/photos/${one!.id}/restore`, undefined, { 'If-Match': String(deleted.jobVersion) });
    expect(restored.photo.deletedAt).toBeNull();
    expect((await as.tech.expectOk('get', `/api/jobs/${job.id}/photos`)).items).toHaveLength(2);
    expect((await as.tech.send('post', `/api/photos/${one!.id}/restore`, undefined, { 'If-Match': String(restored.jobVersion) })).status).toBe(409);
  });

  it('should answer a retried upload (same clientUploadId, old version) with the stored photo, not a copy', async () => {
    const job = await jobInProgress();
    const file = [{ content: await makePng(), name: 'retry.png' }];
    const first = await upload('tech', job.id, job.version, file, { clientUploadId: 'phone-7f3a-0001', caption: 'Rack' });
    expect(first.status).toBe(201);
    const filesAfterFirst = await companyFiles();
    const retry = await upload('tech', job.id, job.version, file, { clientUploadId: 'phone-7f3a-0001', caption: 'Rack' });
    expect(retry.status).toBe(200);
    expect(retry.body).toMatchObject({ isReplay: true, jobVersion: first.body.jobVersion, photos: [{ id: first.body.photos[0].id }] });
    expect(await photoRows(job.id)).toBe(1);
    expect(await companyFiles()).toEqual(filesAfterFirst);
    expect(await jobVersion(job.id)).toBe(first.body.jobVersion);

    // The same client id on another job is another upload.
    const other = await jobInProgress();
    expect((await upload('tech', other.id, other.version, file, { clientUploadId: 'phone-7f3a-0001' })).status).toBe(201);
  });

  it('should hide every photo route from another company (404)', async () => {
    const job = await jobInProgress();
    const res = await upload('office', job.id, job.version, [{ content: await makePng(), name: 'p.png' }]);
    const photo = res.body.photos[0] as { id: string };
    const version = { 'If-Match': String(res.body.jobVersion) };
    expect((await as.otherAdmin.send('get', `/api/jobs/${job.id}/photos`)).status).toBe(404);
    for (const variant of ['thumb', 'screen', 'print', 'original']) expect((await get('otherAdmin', `/api/photos/${photo.id}/${variant}`)).status).toBe(404);
    expect((await as.otherAdmin.send('patch', `/api/photos/${photo.id}`, { caption: 'mine now' }, version)).status).toBe(404);
    expect((await as.otherAdmin.send('delete', `/api/photos/${photo.id}`, undefined, version)).status).toBe(404);
    expect((await as.otherAdmin.send('post', `/api/photos/${photo.id}/restore`, undefined, version)).status).toBe(404);
    expect((await as.homeowner.send('get', `/api/jobs/${job.id}/photos`)).status).toBe(403);
    expect(await jobVersion(job.id)).toBe(res.body.jobVersion);
  });
});
