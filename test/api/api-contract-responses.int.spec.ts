import { randomBytes, randomUUID } from 'node:crypto';
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

import type { NestExpressApplication } from '@nestjs/platform-express';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import type { ApiContractSpec } from '../../api/src/common/api-contract.decorator.js';
import { DEMO_AS_BUILT } from '../../api/src/domain/as-built/demo-as-built.js';
import { DEFAULT_DEPTH_RULES } from '../../api/src/domain/depth/depth-rules.js';
import { DiskStorage } from '../../api/src/storage/disk-storage.js';
import { OBJECT_STORAGE } from '../../api/src/storage/object-storage.js';
import { makePng } from '../fixtures/photos/make-photos.js';
import { contractRoutes, expectAnswerMatchesContract } from '../support/contract.js';
import { createCompany, TEST_PASSWORD, type TestCompany, withDb } from '../support/fixtures.js';
import { type Api, apiAs, createJob, createSite, insertRecordedJob, siteVersion } from '../support/records.js';
import { bearer, type Session, signIn } from '../support/session.js';
import { createTestApp } from '../support/test-app.js';

/**
 * Issue 20: real answers against their contracts. A sample of every GET route (on arranged records and
 * the demo as-built) and the main writes are called as the office, and each body is parsed with the
 * route's zod schema: a field the API sends that the schema lacks, a missing one or a wrong type fails.
 */
type Method = 'get' | 'post' | 'put' | 'patch' | 'delete';

interface Sample {
  path: string;
  body?: object;
  headers?: Record<string, string>;
  /** Who calls: the office unless said otherwise. */
  as?: 'office' | 'admin' | 'homeowner' | 'anonymous';
}

describe('API answers match their contracts', () => {
  let app: NestExpressApplication;
  let company: TestCompany;
  let office: Api;
  const sessions = new Map<string, Session>();
  let contracts: Map<string, ApiContractSpec | undefined>;
  let siteId: string;
  let customerId: string;
  let jobId: string;
  let runId: string;
  let uploadsDir: string;
  let photoId: string;
  let packetId: string;
  let issuedJobId: string;
  let locateToken: string;
  let mail: { mailId: string; attachmentId: string };

  /** An issued job with a ready revision whose (stand-in) files are stored, as the authorization matrix arranges it. */
  async function readyPacket(): Promise<{ id: string; jobId: string }> {
    const job = await insertRecordedJob(company, siteId, { crewLeadUserId: company.users.lead.id, technicianUserIds: [] }, DEMO_AS_BUILT);
    const storage = new DiskStorage(uploadsDir);
    const id = randomUUID();
    const pdf = await storage.put(`companies/${company.id}/packets/${id}/packet-rev-1.pdf`, Buffer.from('%PDF-1.4 contract'), 'application/pdf');
    const zip = await storage.put(`companies/${company.id}/packets/${id}/packet-rev-1.zip`, Buffer.from('PK contract'), 'application/zip');
    await withDb(async (db) => {
      await db.query(`update jobs set status = 'issued' where id = $1`, [job.id]);
      await db.query(
        `insert into packet_revisions (id, company_id, job_id, revision, status, snapshot, paper_size, pdf_key, pdf_bytes, pdf_sha256, page_count, zip_key, zip_bytes, zip_sha256, attempts)
         values ($1, $2, $3, 1, 'ready', '{}'::jsonb, 'letter', $4, $5, $6, 1, $7, $8, $9, 1)`,
        [id, company.id, job.id, pdf.key, pdf.bytes, pdf.sha256, zip.key, zip.bytes, zip.sha256],
      );
    });
    return { id, jobId: job.id };
  }

  beforeAll(async () => {
    uploadsDir = await mkdtemp(join(tmpdir(), 'loamline-contract-uploads-'));
    app = await createTestApp({ override: (builder) => builder.overrideProvider(OBJECT_STORAGE).useValue(new DiskStorage(uploadsDir)) });
    contracts = contractRoutes(app);
    company = await createCompany('Contract Co');
    for (const role of ['office', 'admin', 'homeowner'] as const) sessions.set(role, await signIn(app, company.users[role]));
    office = apiAs(app, sessions.get('office')!);
    ({ siteId, customerId } = await createSite(office, DEMO_AS_BUILT.site));
    await office.expectOk('post', `/api/sites/${siteId}/reference-points`, { label: 'Gate post', x: 1, y: 2 }, { 'If-Match': `"${await siteVersion(office, siteId)}"` });
    await office.expectOk('post', `/api/sites/${siteId}/homeowners`, { userId: company.users.homeowner.id });
    const demo = await insertRecordedJob(company, siteId, { crewLeadUserId: company.users.lead.id, technicianUserIds: [company.users.tech.id] }, DEMO_AS_BUILT);
    jobId = demo.id;
    runId = demo.ids.get(DEMO_AS_BUILT.runs.find((run) => (run.depthReadings?.length ?? 0) > 0)!.id)!;
    await createJob(office, siteId);
    const upload = await request(app.getHttpServer())
      .post(`/api/jobs/${jobId}/photos`)
      .set(bearer(sessions.get('office')!))
      .set('If-Match', String(demo.version))
      .field('caption', 'Trench at the spa')
      .attach('files', await makePng(), 'trench.png');
    expectAnswerMatchesContract(contracts.get('POST /api/jobs/:jobId/photos'), 'POST /api/jobs/:jobId/photos', upload);
    photoId = upload.body.photos[0].id;
    ({ id: packetId, jobId: issuedJobId } = await readyPacket());
    const link = await call('post', 'POST /api/sites/:siteId/locate-links', { path: `/api/sites/${siteId}/locate-links`, body: { expiresInDays: 7 } });
    expect(link.status, JSON.stringify(link.body)).toBe(201);
    locateToken = new URL(link.body.url as string).pathname.split('/').pop()!;
    mail = await withDb(async (db) => {
      const message = await db.query(
        `insert into captured_mail (company_id, from_address, to_addresses, subject, headers, size_bytes)
         values ($1, 'sender@loamline.example', array['someone@example.net'], 'fixture', '{}'::jsonb, 1) returning id`,
        [company.id],
      );
      const attachment = await db.query(
        `insert into captured_mail_attachments (mail_id, filename, content_type, size_bytes, content)
         values ($1, 'note.txt', 'text/plain', 5, $2) returning id`,
        [message.rows[0].id, Buffer.from('hello')],
      );
      return { mailId: message.rows[0].id as string, attachmentId: attachment.rows[0].id as string };
    });
  });

  afterAll(async () => {
    await app?.close();
    if (uploadsDir) await rm(uploadsDir, { recursive: true, force: true });
  });

  /** One sample per GET route, in the matrix's notation; arranged in beforeAll. */
  const gets: Record<string, () => Sample> = {
    'GET /api/health': () => ({ path: '/api/health', as: 'anonymous' }),
    'GET /api/auth/me': () => ({ path: '/api/auth/me' }),
    // Only the e-mailed link knows a live token: an unknown one answers the error shape.
    'GET /api/auth/invitations/:token': () => ({ path: `/api/auth/invitations/${randomBytes(32).toString('base64url')}`, as: 'anonymous' }),
    'GET /api/users': () => ({ path: '/api/users?pageSize=5' }),
    'GET /api/invitations': () => ({ path: '/api/invitations' }),
    'GET /api/customers': () => ({ path: '/api/customers?q=Fixture' }),
    'GET /api/customers/:id': () => ({ path: `/api/customers/${customerId}` }),
    'GET /api/sites': () => ({ path: '/api/sites' }),
    'GET /api/sites/:id': () => ({ path: `/api/sites/${siteId}` }),
    'GET /api/sites/:siteId/features': () => ({ path: `/api/sites/${siteId}/features` }),
    // No plan image was uploaded: the error shape (the upload and its answer are in site-plan-image).
    'GET /api/sites/:siteId/plan-image': () => ({ path: `/api/sites/${siteId}/plan-image` }),
    'GET /api/jobs': () => ({ path: '/api/jobs?sort=-updatedAt&pageSize=10' }),
    'GET /api/jobs/:id': () => ({ path: `/api/jobs/${jobId}` }),
    // The demo as-built: every item kind, depth readings, checks, GPS origin (GeoJSON) and findings.
    'GET /api/jobs/:id/as-built': () => ({ path: `/api/jobs/${jobId}/as-built` }),
    'GET /api/jobs/:id/drawings/site-plan.svg': () => ({ path: `/api/jobs/${jobId}/drawings/site-plan.svg?units=imperial` }),
    'GET /api/jobs/:id/drawings/schematic.svg': () => ({ path: `/api/jobs/${jobId}/drawings/schematic.svg` }),
    'GET /api/jobs/:jobId/photos': () => ({ path: `/api/jobs/${jobId}/photos?includeDeleted=true` }),
    'GET /api/photos/:id/:variant': () => ({ path: `/api/photos/${photoId}/thumb` }),
    'GET /api/jobs/:jobId/signatures': () => ({ path: `/api/jobs/${jobId}/signatures` }),
    'GET /api/jobs/:jobId/packets': () => ({ path: `/api/jobs/${issuedJobId}/packets` }),
    'GET /api/packets/:id': () => ({ path: `/api/packets/${packetId}` }),
    'GET /api/packets/:id/pdf': () => ({ path: `/api/packets/${packetId}/pdf` }),
    'GET /api/packets/:id/archive.zip': () => ({ path: `/api/packets/${packetId}/archive.zip` }),
    'GET /api/packets/:id/send-options': () => ({ path: `/api/packets/${packetId}/send-options` }),
    'GET /api/packets/:id/deliveries': () => ({ path: `/api/packets/${packetId}/deliveries` }),
    'GET /api/jobs/:jobId/deliveries': () => ({ path: `/api/jobs/${issuedJobId}/deliveries` }),
    'GET /api/deliveries/failed': () => ({ path: '/api/deliveries/failed' }),
    'GET /api/company/settings': () => ({ path: '/api/company/settings' }),
    'GET /api/me/preferences': () => ({ path: '/api/me/preferences' }),
    'GET /api/company/profile': () => ({ path: '/api/company/profile' }),
    // No logo uploaded: the error shape (the upload is in the writes below).
    'GET /api/company/profile/logo': () => ({ path: '/api/company/profile/logo' }),
    'GET /api/company/depth-rules': () => ({ path: '/api/company/depth-rules' }),
    'GET /api/outbox/status': () => ({ path: '/api/outbox/status' }),
    'GET /api/outbox': () => ({ path: '/api/outbox' }),
    'GET /api/outbox/:id': () => ({ path: `/api/outbox/${mail.mailId}` }),
    'GET /api/outbox/:id/attachments/:attachmentId': () => ({ path: `/api/outbox/${mail.mailId}/attachments/${mail.attachmentId}` }),
    'GET /api/signup/status': () => ({ path: '/api/signup/status', as: 'anonymous' }),
    // The receipt is only in the sign-up answer of a live sign-up: an unknown one answers the error shape.
    'GET /api/signup/mail/:receipt': () => ({ path: `/api/signup/mail/${randomBytes(32).toString('base64url')}`, as: 'anonymous' }),
    'GET /api/sites/:siteId/locate-links': () => ({ path: `/api/sites/${siteId}/locate-links` }),
    'GET /api/locate/:token': () => ({ path: `/api/locate/${locateToken}`, as: 'anonymous' }),
    'GET /api/locate/:token/map.geojson': () => ({ path: `/api/locate/${locateToken}/map.geojson`, as: 'anonymous' }),
    'GET /api/locate/:token/sheet.pdf': () => ({ path: `/api/locate/${locateToken}/sheet.pdf`, as: 'anonymous' }),
    'GET /api/locate/:token/runs/:runId/depth-profile.svg': () => ({ path: `/api/locate/${locateToken}/runs/${runId}/depth-profile.svg`, as: 'anonymous' }),
    'GET /api/locate/:token/photos/:photoId/:variant': () => ({ path: `/api/locate/${locateToken}/photos/${photoId}/thumb`, as: 'anonymous' }),
    'GET /api/portal/sites': () => ({ path: '/api/portal/sites', as: 'homeowner' }),
    'GET /api/portal/sites/:siteId': () => ({ path: `/api/portal/sites/${siteId}`, as: 'homeowner' }),
    'GET /api/portal/sites/:siteId/map': () => ({ path: `/api/portal/sites/${siteId}/map`, as: 'homeowner' }),
    'GET /api/portal/packets/:id/pdf': () => ({ path: `/api/portal/packets/${packetId}/pdf`, as: 'homeowner' }),
    'GET /api/portal/packets/:id/archive.zip': () => ({ path: `/api/portal/packets/${packetId}/archive.zip`, as: 'homeowner' }),
    'GET /api/jobs/:id/drawings/runs/:runId/depth-profile.svg': () => ({ path: `/api/jobs/${jobId}/drawings/runs/${runId}/depth-profile.svg` }),
  };

  async function call(method: Method, route: string, sample: Sample) {
    let req = request(app.getHttpServer())[method](sample.path);
    const session = sessions.get(sample.as ?? 'office');
    if (session && sample.as !== 'anonymous') req = req.set(bearer(session));
    for (const [name, value] of Object.entries(sample.headers ?? {})) req = req.set(name, value);
    const res = sample.body === undefined ? await req : await req.send(sample.body);
    expectAnswerMatchesContract(contracts.get(route), route, res);
    return res;
  }

  it('has a sample for every GET route', () => {
    const missing = [...contracts.keys()].filter((route) => route.startsWith('GET ') && !(route in gets));
    expect(missing).toEqual([]);
  });

  it.each(Object.keys(gets))('%s', async (route) => {
    await call('get', route, gets[route]!());
  });

  it('customer writes answer their contracts', async () => {
    const created = await call('post', 'POST /api/customers', { path: '/api/customers', body: { name: 'Contract Customer', email: 'Owner@Contract.Example' } });
    expect(created.status).toBe(201);
    const id = created.body.id as string;
    expect((await call('patch', 'PATCH /api/customers/:id', { path: `/api/customers/${id}`, body: { phone: '555 0100' } })).status).toBe(200);
    expect((await call('patch', 'PATCH /api/customers/:id', { path: `/api/customers/${id}`, body: { email: 'not an address' } })).status).toBe(400);
    expect((await call('delete', 'DELETE /api/customers/:id', { path: `/api/customers/${id}` })).status).toBe(204);
  });

  it('site writes answer their contracts', async () => {
    const { siteId: site } = await createSite(office);
    const ifMatch = async () => ({ 'If-Match': `"${await siteVersion(office, site)}"` });
    expect((await call('patch', 'PATCH /api/sites/:id', { path: `/api/sites/${site}`, body: { notes: 'Dog in the yard' }, headers: await ifMatch() })).status).toBe(200);
    const point = await call('post', 'POST /api/sites/:siteId/reference-points', { path: `/api/sites/${site}/reference-points`, body: { label: 'Corner', x: 0, y: 0 }, headers: await ifMatch() });
    expect(point.status).toBe(201);
    expect(
      (await call('patch', 'PATCH /api/sites/:siteId/reference-points/:pointId', { path: `/api/sites/${site}/reference-points/${point.body.id}`, body: { x: 2 }, headers: await ifMatch() })).status,
    ).toBe(200);
    expect((await call('delete', 'DELETE /api/sites/:siteId/reference-points/:pointId', { path: `/api/sites/${site}/reference-points/${point.body.id}`, headers: await ifMatch() })).status).toBe(200);
    const feature = await call('post', 'POST /api/sites/:siteId/features', {
      path: `/api/sites/${site}/features`,
      body: { kind: 'fence', name: 'Fence', shape: 'line', points: [{ x: 0, y: 0 }, { x: 5, y: 0 }] },
      headers: await ifMatch(),
    });
    expect(feature.status).toBe(201);
    expect((await call('patch', 'PATCH /api/sites/:siteId/features/:featureId', { path: `/api/sites/${site}/features/${feature.body.id}`, body: { name: 'North fence' }, headers: await ifMatch() })).status).toBe(200);
    expect((await call('delete', 'DELETE /api/sites/:siteId/features/:featureId', { path: `/api/sites/${site}/features/${feature.body.id}`, headers: await ifMatch() })).status).toBe(200);
    expect((await call('post', 'POST /api/sites/:siteId/homeowners', { path: `/api/sites/${site}/homeowners`, body: { userId: company.users.homeowner.id } })).status).toBe(201);
    expect((await call('delete', 'DELETE /api/sites/:siteId/homeowners/:userId', { path: `/api/sites/${site}/homeowners/${company.users.homeowner.id}` })).status).toBe(204);
    expect((await call('delete', 'DELETE /api/sites/:id', { path: `/api/sites/${site}` })).status).toBe(204);
  });

  it('account writes answer their contracts', async () => {
    const invitation = await call('post', 'POST /api/invitations', { path: '/api/invitations', body: { email: `new.${randomUUID()}@contract.example`, role: 'tech' } });
    expect(invitation.status).toBe(201);
    expect((await call('post', 'POST /api/invitations/:id/resend', { path: `/api/invitations/${invitation.body.id}/resend` })).status).toBe(202);
    expect((await call('delete', 'DELETE /api/invitations/:id', { path: `/api/invitations/${invitation.body.id}` })).status).toBe(204);
    expect((await call('patch', 'PATCH /api/users/:id', { path: `/api/users/${company.users.tech.id}`, body: { name: 'Renamed Tech' }, as: 'admin' })).status).toBe(200);
    const signedIn = await call('post', 'POST /api/auth/sign-in', { path: '/api/auth/sign-in', body: { email: company.users.tech.email, password: TEST_PASSWORD }, as: 'anonymous' });
    expect(signedIn.status).toBe(200);
    expect((await call('post', 'POST /api/auth/password-reset', { path: '/api/auth/password-reset', body: { email: `nobody.${randomUUID()}@contract.example` }, as: 'anonymous' })).status).toBe(202);
    expect((await call('post', 'POST /api/auth/sign-out', { path: '/api/auth/sign-out', as: 'anonymous' })).status).toBe(204);
  });

  it('photo, packet e-mail and delivery writes answer their contracts', async () => {
    const job = (await call('get', 'GET /api/jobs/:id', { path: `/api/jobs/${jobId}` })).body;
    let version = job.version as number;
    const write = async (method: Method, route: string, path: string, body?: object) => {
      const res = await call(method, route, { path, body, headers: { 'If-Match': `"${version}"` } });
      expect(res.status, JSON.stringify(res.body)).toBeLessThan(300);
      version = res.body.jobVersion;
      return res.body;
    };
    await write('patch', 'PATCH /api/photos/:id', `/api/photos/${photoId}`, { caption: 'Spa trench, north end' });
    await write('delete', 'DELETE /api/photos/:id', `/api/photos/${photoId}`);
    await write('post', 'POST /api/photos/:id/restore', `/api/photos/${photoId}/restore`);
    const sent = await call('post', 'POST /api/packets/:id/send', { path: `/api/packets/${packetId}/send`, body: { to: company.users.homeowner.email } });
    expect(sent.status, JSON.stringify(sent.body)).toBe(202);
    const failed = await withDb(async (db) => {
      const { rows } = await db.query(
        `insert into packet_deliveries (company_id, revision_id, to_address, status, attempts, last_error)
         values ($1, $2, $3, 'failed', 3, 'connect ECONNREFUSED 127.0.0.1:2525') returning id`,
        [company.id, packetId, company.users.homeowner.email],
      );
      return rows[0].id as string;
    });
    await call('get', 'GET /api/deliveries/failed', { path: '/api/deliveries/failed' });
    expect((await call('post', 'POST /api/deliveries/:id/dismiss', { path: `/api/deliveries/${failed}/dismiss` })).status).toBe(200);
  });

  it('settings, profile, depth-rule and locate-link writes answer their contracts', async () => {
    expect((await call('patch', 'PATCH /api/company/settings', { path: '/api/company/settings', body: { paperSize: 'letter' }, as: 'admin' })).status).toBe(200);
    expect((await call('patch', 'PATCH /api/me/preferences', { path: '/api/me/preferences', body: { lengthUnits: null } })).status).toBe(200);
    expect((await call('patch', 'PATCH /api/company/profile', { path: '/api/company/profile', body: { phone: '(555) 010-0150' }, as: 'admin' })).status).toBe(200);
    const logo = await request(app.getHttpServer())
      .put('/api/company/profile/logo')
      .set(bearer(sessions.get('admin')!))
      .attach('file', await makePng(), 'logo.png');
    expectAnswerMatchesContract(contracts.get('PUT /api/company/profile/logo'), 'PUT /api/company/profile/logo', logo);
    expect(logo.status).toBe(200);
    expect((await call('get', 'GET /api/company/profile/logo', { path: '/api/company/profile/logo' })).status).toBe(200);
    expect((await call('delete', 'DELETE /api/company/profile/logo', { path: '/api/company/profile/logo', as: 'admin' })).status).toBe(200);
    expect((await call('put', 'PUT /api/company/depth-rules', { path: '/api/company/depth-rules', body: DEFAULT_DEPTH_RULES, as: 'admin' })).status).toBe(200);
    expect((await call('delete', 'DELETE /api/company/depth-rules', { path: '/api/company/depth-rules', as: 'admin' })).status).toBe(200);
    const link = await call('post', 'POST /api/sites/:siteId/locate-links', { path: `/api/sites/${siteId}/locate-links`, body: { expiresInDays: 1 } });
    expect((await call('delete', 'DELETE /api/locate-links/:id', { path: `/api/locate-links/${link.body.id}` })).status).toBe(204);
    const signup = await call('post', 'POST /api/signup', {
      path: '/api/signup',
      body: { companyName: 'Contract Start-up', name: 'Contract Founder', email: `founder.${randomUUID()}@contract.example`, password: 'long-enough-password' },
      as: 'anonymous',
    });
    expect(signup.status).toBe(202);
  });

  it('the analysis of the demo as-built answers its contract', async () => {
    expect((await call('post', 'POST /api/analysis', { path: '/api/analysis', body: { asBuilt: DEMO_AS_BUILT } })).status).toBe(200);
  });

  it('job and record writes answer their contracts', async () => {
    const job = await call('post', 'POST /api/jobs', { path: '/api/jobs', body: { siteId, title: 'Contract job', crewLeadUserId: company.users.lead.id } });
    expect(job.status).toBe(201);
    const base = `/api/jobs/${job.body.id}`;
    let version = job.body.version as number;
    const write = async (method: Method, route: string, path: string, body?: object) => {
      const res = await call(method, route, { path: `${base}${path}`, body, headers: { 'If-Match': `"${version}"` } });
      expect(res.status, JSON.stringify(res.body)).toBeLessThan(300);
      version = res.body.jobVersion ?? res.body.version;
      return res.body;
    };
    await write('patch', 'PATCH /api/jobs/:id', '', { notes: 'Gate code 1234' });
    await write('post', 'POST /api/jobs/:id/status', '/status', { to: 'in_progress' });
    const zone = await write('post', 'POST /api/jobs/:jobId/zones', '/zones', { name: 'Patio' });
    await write('patch', 'PATCH /api/jobs/:jobId/zones/:zoneId', `/zones/${zone.zone.id}`, { name: 'Back patio' });
    const amp = await write('post', 'POST /api/jobs/:jobId/items', '/items', {
      kind: 'amplifier',
      label: 'Amp',
      channels: [{ name: 'Patio' }],
      ratedWatts8Ohm: 100,
      minimumImpedanceOhm: 4,
    });
    const speaker = await write('post', 'POST /api/jobs/:jobId/items', '/items', { kind: 'speaker', label: 'Satellite', nominalImpedanceOhm: 8, zoneId: zone.zone.id });
    await write('put', 'PUT /api/jobs/:jobId/items/:itemId', `/items/${speaker.item.id}`, { kind: 'speaker', label: 'Satellite P1', nominalImpedanceOhm: 8 });
    const channel = { amplifierItemId: amp.item.id, channelId: amp.item.channels[0].id };
    await write('put', 'PUT /api/jobs/:jobId/items/:itemId/channels/:channelId/setup', `/items/${amp.item.id}/channels/${channel.channelId}/setup`, {});
    const runBody = {
      label: 'Amp to satellite',
      fromItemId: amp.item.id,
      toItemId: speaker.item.id,
      cableType: '14/2 direct burial',
      gauge: { system: 'awg', awg: 14 },
      conductors: 2,
      pairs: [{ pairIndex: 1, channel }],
      measuredLengthM: 10,
      method: 'direct_burial',
    };
    const run = await write('post', 'POST /api/jobs/:jobId/runs', '/runs', runBody);
    await write('put', 'PUT /api/jobs/:jobId/runs/:runId', `/runs/${run.run.id}`, { ...runBody, measuredLengthM: 11 });
    const reading = await write('post', 'POST /api/jobs/:jobId/runs/:runId/depth-readings', `/runs/${run.run.id}/depth-readings`, { stationM: 2, depthM: 0.3 });
    await write('patch', 'PATCH /api/jobs/:jobId/runs/:runId/depth-readings/:readingId', `/runs/${run.run.id}/depth-readings/${reading.depthReading.id}`, { depthM: 0.35 });
    const check = await write('post', 'POST /api/jobs/:jobId/checks', '/checks', { channel, quantity: 'dc_resistance', measuredOhm: 6.8 });
    await write('put', 'PUT /api/jobs/:jobId/checks/:checkId', `/checks/${check.check.id}`, { channel, quantity: 'dc_resistance', measuredOhm: 6.9 });
    await call('get', 'GET /api/jobs/:id/as-built', { path: `${base}/as-built` });
    await write('delete', 'DELETE /api/jobs/:jobId/checks/:checkId', `/checks/${check.check.id}`);
    await write('delete', 'DELETE /api/jobs/:jobId/runs/:runId/depth-readings/:readingId', `/runs/${run.run.id}/depth-readings/${reading.depthReading.id}`);
    await write('delete', 'DELETE /api/jobs/:jobId/runs/:runId', `/runs/${run.run.id}`);
    await write('delete', 'DELETE /api/jobs/:jobId/items/:itemId', `/items/${speaker.item.id}`);
    await write('delete', 'DELETE /api/jobs/:jobId/zones/:zoneId', `/zones/${zone.zone.id}`);
    // A stale version: 412 with the error shape and currentVersion.
    const stale = await call('patch', 'PATCH /api/jobs/:id', { path: base, body: { notes: 'late' }, headers: { 'If-Match': '"1"' } });
    expect(stale.status).toBe(412);
  });
});
