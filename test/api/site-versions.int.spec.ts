import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

import type { NestExpressApplication } from '@nestjs/platform-express';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { JOB_STATUS_LABELS } from '../../api/src/domain/jobs/job-rules.js';
import { DiskStorage } from '../../api/src/storage/disk-storage.js';
import { OBJECT_STORAGE } from '../../api/src/storage/object-storage.js';
import { makePng } from '../fixtures/photos/make-photos.js';
import { createCompany, createUser, type TestCompany, type TestUser, withDb } from '../support/fixtures.js';
import { type Api, apiAs, createJob, createSite, type JobFixture, moveJob, siteVersion, siteWrite } from '../support/records.js';
import { bearer, type Session, signIn } from '../support/session.js';
import { createTestApp } from '../support/test-app.js';

/**
 * Issue 18 §2: a site's geometry (reference points, north, origin, plan image and calibration) places
 * every job's record on the plan. Site writes are versioned (If-Match) like job writes; a geometry
 * change bumps every open job on the site, is refused while a job there is under review, and is allowed
 * to the office and to crew leads on an open job's crew at the site only. Refused writes write nothing.
 */
describe('site versions and site geometry behind jobs', () => {
  let app: NestExpressApplication;
  let uploadsDir: string;
  let company: TestCompany;
  /** A second crew lead, on no crew of the jobs below unless a test puts them there. */
  let otherLead: TestUser;
  const sessions = {} as Record<'office' | 'lead' | 'otherLead' | 'tech', Session>;
  const as = {} as Record<'office' | 'lead' | 'otherLead' | 'tech', Api>;

  const CALIBRATION = { a: { x: 10, y: 20 }, b: { x: 110, y: 20 }, distanceM: 5 };

  /** What a refused write must leave alone: the site row, its reference points and the jobs' versions. */
  async function stateOf(siteId: string) {
    return withDb(async (db) => ({
      site: (await db.query('select * from sites where id = $1', [siteId])).rows[0],
      points: (await db.query('select id, label, x, y, notes from reference_points where site_id = $1 order by seq', [siteId])).rows,
      jobs: (await db.query('select id, version, status from jobs where site_id = $1 order by id', [siteId])).rows,
    }));
  }

  const jobVersion = (jobId: string) =>
    withDb(async (db) => (await db.query('select version from jobs where id = $1', [jobId])).rows[0].version as number);

  const ifMatch = (version: number | string) => ({ 'If-Match': `"${version}"` });

  /** A site with one reference point and a plan image, and a job in `status` led by the company's lead. */
  async function arrange(statuses: string[] = []): Promise<{ siteId: string; pointId: string; job: JobFixture }> {
    const { siteId } = await createSite(as.office);
    const pointId = (await siteWrite(as.office, 'post', siteId, '/reference-points', { label: 'House corner', x: 3, y: 4 })).id as string;
    const upload = await request(app.getHttpServer())
      .put(`/api/sites/${siteId}/plan-image`)
      .set(bearer(sessions.office))
      .set(ifMatch(await siteVersion(as.office, siteId)))
      .attach('file', await makePng(300, 200), 'plan.png');
    expect(upload.status, JSON.stringify(upload.body)).toBe(200);
    let job = await createJob(as.office, siteId, { crewLeadUserId: company.users.lead.id, technicianUserIds: [company.users.tech.id] });
    job = await moveJob(as.office, job, ...statuses);
    return { siteId, pointId, job };
  }

  /** Every geometry write to a site, as a request built on `version`. */
  function geometryWrites(siteId: string, pointId: string) {
    return [
      { name: 'move a reference point', method: 'patch', path: `/api/sites/${siteId}/reference-points/${pointId}`, body: { x: 9.5 } },
      { name: 'add a reference point', method: 'post', path: `/api/sites/${siteId}/reference-points`, body: { label: 'Gate post', x: 0, y: 8 } },
      { name: 'delete a reference point', method: 'delete', path: `/api/sites/${siteId}/reference-points/${pointId}` },
      { name: 'turn north', method: 'patch', path: `/api/sites/${siteId}`, body: { northAzimuthDeg: 30 } },
      { name: 'set the WGS 84 origin', method: 'patch', path: `/api/sites/${siteId}`, body: { origin: { lat: 10, lon: 20 } } },
      { name: 'calibrate the plan', method: 'patch', path: `/api/sites/${siteId}`, body: { planCalibration: CALIBRATION } },
      { name: 'replace the plan image', method: 'put', path: `/api/sites/${siteId}/plan-image`, file: true },
      { name: 'remove the plan image', method: 'delete', path: `/api/sites/${siteId}/plan-image` },
    ] as const;
  }

  type Write = ReturnType<typeof geometryWrites>[number];

  async function send(who: keyof typeof sessions, write: Write, headers: Record<string, string>) {
    let req = request(app.getHttpServer())[write.method](write.path).set(bearer(sessions[who]));
    for (const [name, value] of Object.entries(headers)) req = req.set(name, value);
    if ('file' in write) return req.attach('file', await makePng(320, 200), 'plan.png');
    return 'body' in write ? req.send(write.body) : req;
  }

  beforeAll(async () => {
    uploadsDir = await mkdtemp(join(tmpdir(), 'loamline-site-versions-'));
    app = await createTestApp({ override: (builder) => builder.overrideProvider(OBJECT_STORAGE).useValue(new DiskStorage(uploadsDir)) });
    company = await createCompany('Site Versions');
    otherLead = await createUser(company.id, 'lead');
    sessions.office = await signIn(app, company.users.office);
    sessions.lead = await signIn(app, company.users.lead);
    sessions.tech = await signIn(app, company.users.tech);
    sessions.otherLead = await signIn(app, otherLead);
    for (const who of Object.keys(sessions) as (keyof typeof sessions)[]) as[who] = apiAs(app, sessions[who]);
  });

  afterAll(async () => {
    await app?.close();
    if (uploadsDir) await rm(uploadsDir, { recursive: true, force: true });
  });

  it('should give a site a version on GET, with the same ETag', async () => {
    const { siteId } = await createSite(as.office);
    const res = await request(app.getHttpServer()).get(`/api/sites/${siteId}`).set(bearer(sessions.tech));
    expect(res.status).toBe(200);
    expect(res.body.version).toBe(1);
    // The ETag hashes the whole answer (it also shows homeowners, whose changes bump no version).
    expect(res.headers.etag).toMatch(/^"[\w-]+"$/);
    await siteWrite(as.office, 'patch', siteId, '', { notes: 'Gate code with the office' });
    const after = await request(app.getHttpServer()).get(`/api/sites/${siteId}`).set(bearer(sessions.tech));
    expect(after.body.version).toBe(2);
    expect(after.headers.etag).not.toBe(res.headers.etag);
  });

  describe('the probe of issue 18 §2', () => {
    it('should refuse a crew lead on no crew of the job moving a reference point while the job is ready to issue (403), changing nothing', async () => {
      const { siteId, pointId, job } = await arrange(['in_progress', 'submitted', 'ready_to_issue']);
      const asBuiltBefore = await as.office.expectOk('get', `/api/jobs/${job.id}/as-built`);
      const before = await stateOf(siteId);

      const res = await as.otherLead.send('patch', `/api/sites/${siteId}/reference-points/${pointId}`, { x: 9.5, y: 0 }, ifMatch(before.site.version));
      expect(res.status, JSON.stringify(res.body)).toBe(403);
      expect(res.body.code).toBe('NOT_ON_SITE_CREW');

      expect(await stateOf(siteId)).toEqual(before);
      expect(await jobVersion(job.id)).toBe(job.version);
      expect(await as.office.expectOk('get', `/api/jobs/${job.id}/as-built`)).toEqual(asBuiltBefore);
    });

    it('should refuse the same move (409 naming the job) when that lead leads an open job on the site too, and for the office', async () => {
      const { siteId, pointId, job } = await arrange(['in_progress', 'submitted', 'ready_to_issue']);
      await createJob(as.office, siteId, { crewLeadUserId: otherLead.id });
      const before = await stateOf(siteId);
      for (const who of ['otherLead', 'office'] as const) {
        const res = await as[who].send('patch', `/api/sites/${siteId}/reference-points/${pointId}`, { x: 9.5 }, ifMatch(before.site.version));
        expect(res.status, JSON.stringify(res.body)).toBe(409);
        expect(res.body.code).toBe('SITE_JOBS_IN_REVIEW');
        expect(res.body.message).toContain('“Fixture job');
        expect(res.body.message).toContain(`(${JOB_STATUS_LABELS.ready_to_issue.toLowerCase()})`);
      }
      expect(await stateOf(siteId)).toEqual(before);
      expect(await jobVersion(job.id)).toBe(job.version);
    });
  });

  describe('every geometry route', () => {
    it('should refuse a missing (428) or stale (412 VERSION_CONFLICT with currentVersion) If-Match, changing nothing', async () => {
      const { siteId, pointId } = await arrange(['in_progress']);
      for (const write of geometryWrites(siteId, pointId)) {
        const before = await stateOf(siteId);
        const missing = await send('office', write, {});
        expect(missing.status, `${write.name}: ${JSON.stringify(missing.body)}`).toBe(428);
        expect(missing.body.code).toBe('VERSION_REQUIRED');
        expect(missing.body.message).toContain('site');
        const stale = await send('office', write, ifMatch(before.site.version - 1));
        expect(stale.status, `${write.name}: ${JSON.stringify(stale.body)}`).toBe(412);
        expect(stale.body).toMatchObject({ code: 'VERSION_CONFLICT', currentVersion: before.site.version });
        const malformed = await send('office', write, { 'If-Match': 'latest' });
        expect(malformed.status).toBe(400);
        expect(malformed.body.issues[0].path).toBe('If-Match');
        expect(await stateOf(siteId), write.name).toEqual(before);
      }
    }, 90_000);

    it('should refuse each while a job on the site is submitted or ready to issue (409 naming the job), changing nothing', async () => {
      for (const statuses of [['in_progress', 'submitted'], ['in_progress', 'submitted', 'ready_to_issue']]) {
        const { siteId, pointId } = await arrange(statuses);
        for (const write of geometryWrites(siteId, pointId)) {
          const before = await stateOf(siteId);
          const res = await send('office', write, ifMatch(before.site.version));
          expect(res.status, `${write.name}: ${JSON.stringify(res.body)}`).toBe(409);
          expect(res.body.code).toBe('SITE_JOBS_IN_REVIEW');
          const label = JOB_STATUS_LABELS[statuses.at(-1) as 'submitted' | 'ready_to_issue'].toLowerCase();
          expect(res.body.message).toMatch(new RegExp(`“Fixture job \\d+” \\(${label}\\)`));
          expect(await stateOf(siteId), write.name).toEqual(before);
        }
      }
    }, 90_000);

    it('should apply each on the current version, bump the site and every open job on it (not issued ones), so a stale job write conflicts', async () => {
      const { siteId, pointId, job } = await arrange(['in_progress']);
      const draft = await createJob(as.office, siteId);
      const issued = await createJob(as.office, siteId);
      await withDb((db) => db.query(`update jobs set status = 'issued' where id = $1`, [issued.id]));
      let site = (await stateOf(siteId)).site.version as number;
      let open = { [job.id]: job.version, [draft.id]: draft.version };
      for (const write of geometryWrites(siteId, pointId)) {
        // The crew lead sets up the plan on site; the origin stays the office's.
        const res = await send(write.name === 'set the WGS 84 origin' ? 'office' : 'lead', write, ifMatch(site));
        expect(res.status, `${write.name}: ${JSON.stringify(res.body)}`).toBeLessThan(300);
        expect(res.body.siteVersion, write.name).toBe(site + 1);
        expect(res.body.jobVersions, write.name).toEqual({ [job.id]: open[job.id]! + 1, [draft.id]: open[draft.id]! + 1 });
        site = res.body.siteVersion;
        open = res.body.jobVersions;
        expect(await jobVersion(job.id)).toBe(open[job.id]);
        expect(await jobVersion(issued.id), 'an issued job is frozen').toBe(issued.version);
      }
      // The crew's (or office's) write on the version they had before the site moved is refused.
      const stale = await as.office.send('patch', `/api/jobs/${job.id}`, { title: 'Renamed' }, ifMatch(job.version));
      expect(stale.status).toBe(412);
      expect(stale.body).toMatchObject({ code: 'VERSION_CONFLICT', currentVersion: open[job.id] });
    }, 90_000);

    it('should let the office change a site’s name and notes while a job is under review, bumping only the site', async () => {
      const { siteId, job } = await arrange(['in_progress', 'submitted']);
      const res = await siteWrite(as.office, 'patch', siteId, '', { label: 'Renamed yard', notes: 'Dog in the yard' });
      expect(res).toMatchObject({ label: 'Renamed yard', version: res.siteVersion, jobVersions: {} });
      expect(await jobVersion(job.id)).toBe(job.version);
      expect((await as.lead.send('patch', `/api/sites/${siteId}`, { notes: 'x' }, ifMatch(res.siteVersion))).status).toBe(403);
    });
  });

  describe('who may change a site’s geometry', () => {
    it('should allow the office and a crew lead (or crew member lead) of an open job at the site; refuse other leads and technicians (403)', async () => {
      const { siteId, pointId, job } = await arrange(['in_progress']);
      const move = async (who: keyof typeof sessions, x: number) =>
        as[who].send('patch', `/api/sites/${siteId}/reference-points/${pointId}`, { x }, ifMatch(await siteVersion(as.office, siteId)));
      expect((await move('office', 1)).status).toBe(200);
      expect((await move('lead', 2)).status).toBe(200);
      const before = await stateOf(siteId);
      for (const who of ['otherLead', 'tech'] as const) {
        const res = await move(who, 3);
        expect(res.status, who).toBe(403);
        expect(await stateOf(siteId)).toEqual(before);
      }
      // On the crew (not leading it): allowed.
      await withDb((db) => db.query('insert into job_technicians (job_id, user_id) values ($1, $2)', [job.id, otherLead.id]));
      expect((await move('otherLead', 4)).status).toBe(200);
      // Only while the job is open: once issued, its crew no longer moves the site.
      await withDb((db) => db.query(`update jobs set status = 'issued' where id = $1`, [job.id]));
      expect((await move('lead', 5)).status).toBe(403);
      expect((await move('office', 5)).status).toBe(200);
    }, 90_000);
  });

  describe('issued packets stay frozen', () => {
    it('should keep the plan image an issued packet names when the site’s image is replaced or removed', async () => {
      const { siteId, job } = await arrange(['in_progress']);
      const refs = async () =>
        (await withDb((db) => db.query('select plan_image_ref, plan_image_screen_ref from sites where id = $1', [siteId]))).rows[0] as {
          plan_image_ref: string | null;
          plan_image_screen_ref: string | null;
        };
      const issuedWith = await refs();
      // A stand-in issued revision whose snapshot names the current screen copy as its plan underlay.
      const snapshot = { site: { planImage: { screenKey: issuedWith.plan_image_screen_ref, widthPx: 300, heightPx: 200, calibration: CALIBRATION } } };
      await withDb((db) =>
        db.query(
          `insert into packet_revisions (company_id, job_id, revision, status, snapshot, paper_size, pdf_key, pdf_sha256, zip_key, zip_sha256, attempts)
           values ($1, $2, 1, 'ready', $3, 'letter', 'stand-in.pdf', $4, 'stand-in.zip', $4, 1)`,
          [company.id, job.id, JSON.stringify(snapshot), '0'.repeat(64)],
        ),
      );
      const stored = async (key: string | null) => new DiskStorage(uploadsDir).getBuffer(key!).then(() => true, () => false);
      expect(await stored(issuedWith.plan_image_screen_ref)).toBe(true);

      const replaced = await request(app.getHttpServer())
        .put(`/api/sites/${siteId}/plan-image`)
        .set(bearer(sessions.office))
        .set(ifMatch(await siteVersion(as.office, siteId)))
        .attach('file', await makePng(320, 200), 'plan.png');
      expect(replaced.status, JSON.stringify(replaced.body)).toBe(200);
      const now = await refs();
      expect(now.plan_image_screen_ref).not.toBe(issuedWith.plan_image_screen_ref);
      // The full-size original no packet names is gone; the issued packet's underlay stays.
      expect(await stored(issuedWith.plan_image_ref)).toBe(false);
      expect(await stored(issuedWith.plan_image_screen_ref)).toBe(true);

      await siteWrite(as.office, 'delete', siteId, '/plan-image');
      expect(await stored(now.plan_image_screen_ref)).toBe(false);
      expect(await stored(issuedWith.plan_image_screen_ref)).toBe(true);
    });
  });

  describe('concurrent site edits', () => {
    it('should lose nothing when two writers read, change and write the site in loops, retrying on conflict', async () => {
      const { siteId, job } = await arrange(['in_progress']);
      const startNorth = (await as.office.expectOk('get', `/api/sites/${siteId}`)).northAzimuthDeg as number;
      const rounds = 6;
      let conflicts = 0;
      /** Read the site, turn north by one degree on top of what was read, write; on a conflict read again. */
      const writer = async (who: 'office' | 'lead') => {
        for (let done = 0; done < rounds; ) {
          const site = await as[who].expectOk('get', `/api/sites/${siteId}`);
          const res = await as[who].send('patch', `/api/sites/${siteId}`, { northAzimuthDeg: site.northAzimuthDeg + 1 }, ifMatch(site.version));
          if (res.status === 412 && res.body.code === 'VERSION_CONFLICT') {
            conflicts += 1;
            continue;
          }
          expect(res.status, JSON.stringify(res.body)).toBe(200);
          done += 1;
        }
      };
      /** Add points on top of the version read; on a conflict read again. */
      const adder = async () => {
        for (let done = 0; done < rounds; ) {
          const version = await siteVersion(as.office, siteId);
          const res = await as.office.send('post', `/api/sites/${siteId}/reference-points`, { label: `Stake ${done}`, x: done, y: 0 }, ifMatch(version));
          if (res.status === 412 && res.body.code === 'VERSION_CONFLICT') {
            conflicts += 1;
            continue;
          }
          expect(res.status, JSON.stringify(res.body)).toBe(201);
          done += 1;
        }
      };
      const before = await stateOf(siteId);
      await Promise.all([writer('office'), writer('lead'), adder()]);
      const after = await stateOf(siteId);
      expect(after.site.north_azimuth_deg).toBe(startNorth + 2 * rounds);
      expect(after.points.length).toBe(before.points.length + rounds);
      expect(after.site.version).toBe(before.site.version + 3 * rounds);
      expect(await jobVersion(job.id)).toBe(job.version + 3 * rounds);
      // How many conflicts there were depends on timing (each was retried on fresh data): logged, not asserted.
      console.info(`site edits: ${conflicts} version conflicts retried`);
    }, 120_000);
  });
});
