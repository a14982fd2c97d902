import type { NestExpressApplication } from '@nestjs/platform-express';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { JobRecordModule } from '../../api/src/jobs/job-record.module.js';
import { JobWriter } from '../../api/src/jobs/job-writer.js';
import { JobsRepository } from '../../api/src/jobs/jobs.repository.js';
import { JobsService } from '../../api/src/jobs/jobs.service.js';
import { PACKET_PHOTO_SOURCE } from '../../api/src/packets/packet-photo-source.js';
import { PacketRenderingModule } from '../../api/src/packets/packet-rendering.module.js';
import { PacketsService } from '../../api/src/packets/packets.service.js';
import { PhotosRepository } from '../../api/src/photos/photos.repository.js';
import { PhotosService } from '../../api/src/photos/photos.service.js';
import { createCompany, type TestCompany, withDb } from '../support/fixtures.js';
import { type Api, apiAs, createJob, createSite, type JobFixture, moveJob } from '../support/records.js';
import { signIn } from '../support/session.js';
import { createTestApp } from '../support/test-app.js';

describe('jobs', () => {
  let app: NestExpressApplication;
  let a: TestCompany;
  let b: TestCompany;
  const as: Record<'admin' | 'office' | 'lead' | 'tech' | 'homeowner' | 'otherAdmin', Api> = {} as never;
  let siteId: string;

  const newJob = (crew: { crewLeadUserId?: string; technicianUserIds?: string[] } = {}) =>
    createJob(as.office, siteId, { crewLeadUserId: a.users.lead.id, technicianUserIds: [a.users.tech.id], ...crew });

  const jobRow = (id: string) =>
    withDb(async (db) => (await db.query('select status, version, revision, title, review_comment from jobs where id = $1', [id])).rows[0]);

  beforeAll(async () => {
    app = await createTestApp();
    a = await createCompany('Jobs A');
    b = await createCompany('Jobs B');
    for (const role of ['admin', 'office', 'lead', 'tech', 'homeowner'] as const) as[role] = apiAs(app, await signIn(app, a.users[role]));
    as.otherAdmin = apiAs(app, await signIn(app, b.users.admin));
    ({ siteId } = await createSite(as.office));
  });

  afterAll(async () => {
    await app.close();
  });

  // One job-record kernel (JobRecordModule): jobs, photos, packets and the renderer share its instances
  // instead of each module registering its own copy of the repository and the writer.
  it('should inject the same JobsRepository, JobWriter and PhotosRepository into every module that uses them', () => {
    const field = (owner: object, name: string): unknown => (owner as Record<string, unknown>)[name];
    const jobs = app.select(JobRecordModule).get(JobsRepository);
    const writer = app.select(JobRecordModule).get(JobWriter);
    const photos = app.select(JobRecordModule).get(PhotosRepository);
    const photosService = app.get(PhotosService, { strict: false });
    // Identity checks as booleans: a failing toBe would try to print two repositories (pools, prepared statements).
    expect({
      jobsService: field(app.get(JobsService, { strict: false }), 'repository') === jobs,
      jobsServiceWriter: field(app.get(JobsService, { strict: false }), 'writer') === writer,
      photosServiceJobs: field(photosService, 'jobs') === jobs,
      photosServiceWriter: field(photosService, 'writer') === writer,
      photosServicePhotos: field(photosService, 'repository') === photos,
      packetsService: field(app.get(PacketsService, { strict: false }), 'jobs') === jobs,
      packetPhotoSource: field(app.select(PacketRenderingModule).get<object>(PACKET_PHOTO_SOURCE), 'repository') === photos,
    }).toEqual({
      jobsService: true,
      jobsServiceWriter: true,
      photosServiceJobs: true,
      photosServiceWriter: true,
      photosServicePhotos: true,
      packetsService: true,
      packetPhotoSource: true,
    });
  });

  describe('create and read', () => {
    it('should create a draft job at version 1 and read it back', async () => {
      const created = await as.office.expectOk('post', '/api/jobs', {
        siteId,
        title: 'Patio sound, phase 1',
        crewLeadUserId: a.users.lead.id,
        technicianUserIds: [a.users.tech.id],
        startDate: '2026-05-11',
        endDate: '2026-05-14',
      });
      expect(created).toMatchObject({
        status: 'draft',
        version: 1,
        revision: 1,
        crewLead: { id: a.users.lead.id },
        technicians: [{ id: a.users.tech.id }],
        site: { id: siteId },
      });
      const read = await as.tech.expectOk('get', `/api/jobs/${created.id}`);
      expect(read).toEqual(created);
      const audit = await withDb((db) => db.query(`select action from audit_log where target_id = $1`, [created.id]));
      expect(audit.rows.map((r) => r.action)).toContain('job.create');
    });

    it.each([
      [{ siteId: undefined, title: 'x' }, 'siteId'],
      [{ siteId: '00000000-0000-4000-8000-000000000000', title: 'x' }, 'siteId'],
      [{ title: '' }, 'title'],
      [{ title: 'x', startDate: '2026-05-14', endDate: '2026-05-01' }, 'endDate'],
      [{ title: 'x', crewLeadUserId: 'tech' }, 'crewLeadUserId'],
    ])('should answer 400 naming the field for %j', async (body, field) => {
      const res = await as.office.send('post', '/api/jobs', { siteId, ...body });
      expect(res.status).toBe(400);
      expect(res.body.issues.map((i: { path: string }) => i.path)).toContain(field);
    });

    it('should refuse a technician as crew lead and another company’s user as technician, naming the field', async () => {
      const res = await as.office.send('post', '/api/jobs', {
        siteId,
        title: 'Crew check',
        crewLeadUserId: a.users.tech.id,
        technicianUserIds: [b.users.tech.id],
      });
      expect(res.status).toBe(400);
      expect(res.body.issues.map((i: { path: string }) => i.path)).toEqual(['crewLeadUserId', 'technicianUserIds.0']);
    });

    it('should answer 400 for another company’s site, and 404 for reads across companies', async () => {
      const job = await newJob();
      const res = await as.otherAdmin.send('post', '/api/jobs', { siteId, title: 'Poach' });
      expect(res.status).toBe(400);
      expect((await as.otherAdmin.send('get', `/api/jobs/${job.id}`)).status).toBe(404);
      expect((await as.otherAdmin.send('get', `/api/jobs/${job.id}/as-built`)).status).toBe(404);
    });
  });

  describe('list', () => {
    let searchSite: string;
    let jobs: JobFixture[];

    beforeAll(async () => {
      const customer = await as.office.expectOk('post', '/api/customers', { name: 'Odalys Threnbury' });
      searchSite = (
        await as.office.expectOk('post', '/api/sites', {
          customerId: customer.id,
          label: 'Threnbury garden',
          addressLine1: '7 Quillfeather Row',
          city: 'Marrowdene',
          country: 'Testland',
        })
      ).id;
      jobs = [];
      for (const title of ['Alpha lighting', 'Bravo sound', 'Charlie spare 50%']) {
        jobs.push(await createJob(as.office, searchSite, { crewLeadUserId: title.startsWith('Alpha') ? a.users.lead.id : undefined }));
        await as.office.expectOk('patch', `/api/jobs/${jobs.at(-1)!.id}`, { title }, { 'If-Match': '1' });
      }
    });

    it('should search across title, site and customer with server paging and a total', async () => {
      const byCustomer = await as.tech.expectOk('get', '/api/jobs?q=threnbury&sort=title&pageSize=2');
      expect(byCustomer.total).toBe(3);
      expect(byCustomer.items.map((j: { title: string }) => j.title)).toEqual(['Alpha lighting', 'Bravo sound']);
      const page2 = await as.tech.expectOk('get', '/api/jobs?q=threnbury&sort=title&pageSize=2&page=2');
      expect(page2.items.map((j: { title: string }) => j.title)).toEqual(['Charlie spare 50%']);
      expect((await as.tech.expectOk('get', '/api/jobs?q=quillfeather')).total).toBe(3);
      expect((await as.tech.expectOk('get', '/api/jobs?q=50%25')).items.map((j: { title: string }) => j.title)).toEqual(['Charlie spare 50%']);
      const desc = await as.tech.expectOk('get', '/api/jobs?q=threnbury&sort=-title');
      expect(desc.items[0]).toMatchObject({ title: 'Charlie spare 50%', customer: { name: 'Odalys Threnbury' }, site: { label: 'Threnbury garden' } });
    });

    it('should filter by status and by "mine"', async () => {
      await moveJob(as.office, { ...jobs[1]!, version: 2 }, 'in_progress');
      const inProgress = await as.office.expectOk('get', '/api/jobs?q=threnbury&status=in_progress');
      expect(inProgress.items.map((j: { id: string }) => j.id)).toEqual([jobs[1]!.id]);
      const both = await as.office.expectOk('get', '/api/jobs?q=threnbury&status=draft,in_progress');
      expect(both.total).toBe(3);
      const repeated = await as.office.expectOk('get', '/api/jobs?q=threnbury&status=in_progress&status=submitted');
      expect(repeated.items.map((j: { id: string }) => j.id)).toEqual([jobs[1]!.id]);
      const drafts = await as.office.expectOk('get', '/api/jobs?q=threnbury&status=draft&status=submitted,issued');
      expect(drafts.total).toBe(2);
      const mine = await as.lead.expectOk('get', '/api/jobs?q=threnbury&mine=true');
      expect(mine.items.map((j: { id: string }) => j.id)).toEqual([jobs[0]!.id]);
    });

    it('should answer 400 for an unknown status or sort, and never list another company’s jobs', async () => {
      for (const query of ['status=finished', 'status=draft,finished', 'status=draft&status=finished']) {
        const bad = await as.office.send('get', `/api/jobs?${query}`);
        expect(bad.status).toBe(400);
        expect(bad.body.issues[0]).toMatchObject({ path: 'status', message: expect.stringContaining('finished') });
      }
      const res = await as.office.send('get', '/api/jobs?sort=password');
      expect(res.status).toBe(400);
      expect(res.body.issues[0].path).toBe('sort');
      const other = await as.otherAdmin.expectOk('get', '/api/jobs?q=threnbury');
      expect(other.total).toBe(0);
    });
  });

  describe('update and delete', () => {
    it('should update details with the current version and bump it', async () => {
      const job = await newJob();
      const updated = await as.office.expectOk('patch', `/api/jobs/${job.id}`, { title: 'Renamed', technicianUserIds: [] }, { 'If-Match': '"1"' });
      expect(updated).toMatchObject({ title: 'Renamed', version: 2, technicians: [] });
    });

    it('should let the office change the crew and dates, and audit which fields changed', async () => {
      const job = await newJob();
      const updated = await as.office.expectOk(
        'patch',
        `/api/jobs/${job.id}`,
        { crewLeadUserId: a.users.office.id, technicianUserIds: [a.users.lead.id, a.users.tech.id], startDate: '2026-06-01', endDate: '2026-06-03' },
        { 'If-Match': '"1"' },
      );
      expect(updated).toMatchObject({ version: 2, crewLead: { id: a.users.office.id }, startDate: '2026-06-01', endDate: '2026-06-03' });
      expect(updated.technicians.map((t: { id: string }) => t.id).sort()).toEqual([a.users.lead.id, a.users.tech.id].sort());
      const cleared = await as.admin.expectOk('patch', `/api/jobs/${job.id}`, { crewLeadUserId: null, technicianUserIds: [], endDate: null }, { 'If-Match': '2' });
      expect(cleared).toMatchObject({ version: 3, crewLead: null, technicians: [], startDate: '2026-06-01', endDate: null });
      const audit = await withDb((db) =>
        db.query(`select details from audit_log where target_id = $1 and action = 'job.update' order by id`, [job.id]),
      );
      expect(audit.rows.map((r) => r.details.fields)).toEqual([
        ['crewLeadUserId', 'technicianUserIds', 'startDate', 'endDate'],
        ['crewLeadUserId', 'technicianUserIds', 'endDate'],
      ]);
    });

    it.each([
      ['a technician as crew lead', () => ({ crewLeadUserId: a.users.tech.id }), 'crewLeadUserId'],
      ['another company’s lead', () => ({ crewLeadUserId: b.users.lead.id }), 'crewLeadUserId'],
      ['a homeowner on the crew', () => ({ technicianUserIds: [a.users.homeowner.id] }), 'technicianUserIds.0'],
      ['another company’s technician', () => ({ technicianUserIds: [a.users.tech.id, b.users.tech.id] }), 'technicianUserIds.1'],
      ['an unknown user', () => ({ technicianUserIds: ['00000000-0000-4000-8000-000000000000'] }), 'technicianUserIds.0'],
      ['someone twice', () => ({ technicianUserIds: [a.users.tech.id, a.users.tech.id] }), 'technicianUserIds'],
      ['a finish before the stored start', () => ({ endDate: '2026-04-30' }), 'endDate'],
      ['a malformed date', () => ({ startDate: '1 May' }), 'startDate'],
    ])('should answer 400 naming the field for %s, and change nothing', async (_what, body, field) => {
      const job = await newJob();
      await as.office.expectOk('patch', `/api/jobs/${job.id}`, { startDate: '2026-05-01' }, { 'If-Match': '1' });
      const res = await as.office.send('patch', `/api/jobs/${job.id}`, body(), { 'If-Match': '2' });
      expect(res.status).toBe(400);
      expect(res.body.issues.map((i: { path: string }) => i.path)).toContain(field);
      const after = await as.office.expectOk('get', `/api/jobs/${job.id}`);
      expect(after).toMatchObject({ version: 2, crewLead: { id: a.users.lead.id }, technicians: [{ id: a.users.tech.id }], endDate: null });
    });

    it('should refuse crew and date changes from the crew lead and technicians', async () => {
      const job = await newJob();
      expect((await as.lead.send('patch', `/api/jobs/${job.id}`, { technicianUserIds: [] }, { 'If-Match': '1' })).status).toBe(403);
      expect((await as.lead.send('patch', `/api/jobs/${job.id}`, { startDate: '2026-07-01' }, { 'If-Match': '1' })).status).toBe(403);
      expect((await as.tech.send('patch', `/api/jobs/${job.id}`, { endDate: '2026-07-01' }, { 'If-Match': '1' })).status).toBe(403);
      expect((await as.otherAdmin.send('patch', `/api/jobs/${job.id}`, { endDate: '2026-07-01' }, { 'If-Match': '1' })).status).toBe(404);
      expect(await jobRow(job.id)).toMatchObject({ version: 1 });
    });

    it('should answer 412 VERSION_CONFLICT with the current version on a stale write, and write nothing', async () => {
      const job = await newJob();
      await as.office.expectOk('patch', `/api/jobs/${job.id}`, { notes: 'first' }, { 'If-Match': '1' });
      const res = await as.admin.send('patch', `/api/jobs/${job.id}`, { title: 'Stale', expectedVersion: 1 });
      expect(res.status).toBe(412);
      expect(res.body).toMatchObject({ statusCode: 412, code: 'VERSION_CONFLICT', currentVersion: 2 });
      expect(await jobRow(job.id)).toMatchObject({ version: 2, title: expect.not.stringContaining('Stale') });
    });

    it('should require a version (428) and refuse a malformed one (400)', async () => {
      const job = await newJob();
      expect((await as.office.send('patch', `/api/jobs/${job.id}`, { title: 'No version' })).status).toBe(428);
      const bad = await as.office.send('patch', `/api/jobs/${job.id}`, { title: 'Bad' }, { 'If-Match': 'yesterday' });
      expect(bad.status).toBe(400);
      expect(bad.body.issues[0].path).toBe('If-Match');
    });

    it('should let the crew lead change only the notes of their own job', async () => {
      const job = await newJob();
      expect((await as.lead.send('patch', `/api/jobs/${job.id}`, { notes: 'gate code at the office' }, { 'If-Match': '1' })).status).toBe(200);
      expect((await as.lead.send('patch', `/api/jobs/${job.id}`, { title: 'Mine now' }, { 'If-Match': '2' })).status).toBe(403);
      const other = await newJob({ crewLeadUserId: undefined, technicianUserIds: [] });
      expect((await as.lead.send('patch', `/api/jobs/${other.id}`, { notes: 'x' }, { 'If-Match': '1' })).status).toBe(403);
    });

    it('should delete a draft job only (office), and 404 across companies', async () => {
      const job = await newJob();
      expect((await as.otherAdmin.send('delete', `/api/jobs/${job.id}`, undefined, { 'If-Match': '1' })).status).toBe(404);
      expect((await as.lead.send('delete', `/api/jobs/${job.id}`, undefined, { 'If-Match': '1' })).status).toBe(403);
      expect((await as.office.send('delete', `/api/jobs/${job.id}`, undefined, { 'If-Match': '1' })).status).toBe(204);
      expect(await jobRow(job.id)).toBeUndefined();
      const started = await moveJob(as.office, await newJob(), 'in_progress');
      const res = await as.office.send('delete', `/api/jobs/${started.id}`, undefined, { 'If-Match': String(started.version) });
      expect(res.status).toBe(409);
      expect(res.body.code).toBe('JOB_NOT_DRAFT');
    });
  });

  describe('status', () => {
    const status = (api: Api, job: JobFixture, to: string, extra: object = {}) =>
      api.send('post', `/api/jobs/${job.id}/status`, { to, expectedVersion: job.version, ...extra });

    it('should let the crew lead start and submit their job, and the office send it back with a comment', async () => {
      let job = await newJob();
      let res = await status(as.lead, job, 'in_progress');
      expect(res.status).toBe(200);
      job = { ...job, version: res.body.version };
      res = await status(as.lead, job, 'submitted');
      expect(res.body).toMatchObject({ status: 'submitted' });
      job = { ...job, version: res.body.version };
      expect((await status(as.lead, job, 'in_progress', { comment: 'oops' })).status).toBe(403);
      res = await status(as.office, job, 'in_progress');
      expect(res.status).toBe(400);
      expect(res.body.issues[0].path).toBe('comment');
      res = await status(as.office, job, 'in_progress', { comment: 'Add a reading at the spa splice.' });
      expect(res.body).toMatchObject({ status: 'in_progress', reviewComment: 'Add a reading at the spa splice.' });
    });

    it('should refuse technicians, leads of other jobs, homeowners and impossible moves', async () => {
      const job = await newJob({ crewLeadUserId: undefined });
      expect((await status(as.tech, job, 'in_progress')).status).toBe(403);
      expect((await status(as.lead, job, 'in_progress')).status).toBe(403);
      expect((await status(as.homeowner, job, 'in_progress')).status).toBe(403);
      const res = await status(as.office, job, 'submitted');
      expect(res.status).toBe(409);
      expect(res.body.code).toBe('INVALID_TRANSITION');
      expect((await status(as.office, job, 'issued' as string)).status).toBe(400);
      expect((await status(as.otherAdmin, job, 'in_progress')).status).toBe(404);
    });

    it('should mark a submitted job ready to issue, and reopen an issued job as the next revision', async () => {
      let job = await moveJob(as.lead, await newJob(), 'in_progress', 'submitted');
      job = await moveJob(as.admin, job, 'ready_to_issue');
      expect(await jobRow(job.id)).toMatchObject({ status: 'ready_to_issue' });
      // Issuing belongs to the packet feature; arrange an issued job directly.
      await withDb((db) => db.query(`update jobs set status = 'issued' where id = $1`, [job.id]));
      const res = await status(as.office, job, 'in_progress');
      expect(res.body).toMatchObject({ status: 'in_progress', revision: 2, version: job.version + 1 });
    });

    it('should answer 412 on a stale version and leave the status alone', async () => {
      const job = await newJob();
      const res = await status(as.office, { ...job, version: 7 }, 'in_progress');
      expect(res.status).toBe(412);
      expect(res.body).toMatchObject({ code: 'VERSION_CONFLICT', currentVersion: 1 });
      expect(await jobRow(job.id)).toMatchObject({ status: 'draft', version: 1 });
    });
  });
});
