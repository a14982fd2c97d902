import { randomBytes, randomUUID } from 'node:crypto';
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

import type { NestExpressApplication } from '@nestjs/platform-express';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { analyzeAsBuilt } from '../../api/src/domain/analysis/analyze.js';
import { DEMO_AS_BUILT } from '../../api/src/domain/as-built/demo-as-built.js';
import { DEFAULT_DEPTH_RULES } from '../../api/src/domain/depth/depth-rules.js';
import { ROLES, type Role } from '../../api/src/domain/auth/roles.js';
import { DiskStorage } from '../../api/src/storage/disk-storage.js';
import { OBJECT_STORAGE } from '../../api/src/storage/object-storage.js';
import { makePng } from '../fixtures/photos/make-photos.js';
import { createCompany, createUser, TEST_PASSWORD, type TestCompany, withDb } from '../support/fixtures.js';
import {
  type Api,
  apiAs,
  createJob,
  createSite,
  insertRecordedJob,
  insertSiteChange,
  insertSmallRecordedJob,
  moveJob,
  siteVersion,
  siteWrite,
} from '../support/records.js';
import { bearer, type Session, signIn } from '../support/session.js';
import { thisPartOf } from '../support/file-parts.js';
import { createTestApp } from '../support/test-app.js';

/**
 * Every API route, called as a signed-out visitor, as each role of company A, and as the admin of
 * company B aimed at company A's records. Each cell is the exact status expected. A route that exists
 * but is missing here (or listed here but gone) fails the first test: add new routes to this table.
 */
type Caller = 'anonymous' | Role | 'otherCompany';
type Expectation = Record<Caller, number>;

interface Call {
  path: string;
  body?: object;
  headers?: Record<string, string>;
  /** Sent as multipart/form-data files under this field name (with `body` as text fields). */
  files?: { field: string; name: string; content: Buffer }[];
}

interface RouteCase {
  expect: Expectation;
  /** Builds the request; may arrange fresh records so that each call stands alone. */
  call: () => Promise<Call> | Call;
  /** For lists: company A's ids must not appear in what company B's admin receives. */
  isList?: boolean;
}

const CALLERS: Caller[] = ['anonymous', ...ROLES, 'otherCompany'];

const everyone = (status: number): Expectation =>
  Object.fromEntries(CALLERS.map((c) => [c, status])) as Expectation;

const signedIn = (status: number): Expectation => ({ ...everyone(status), anonymous: 401 });

const only = (roles: Role[], ok: number, otherCompany: number): Expectation => ({
  ...(Object.fromEntries(CALLERS.map((c) => [c, 403])) as Expectation),
  anonymous: 401,
  ...Object.fromEntries(roles.map((r) => [r, ok])),
  otherCompany,
});

const SIGNATURE_BODY = { signerName: 'Matrix Homeowner', svgPath: 'M 10 60 L 120 40 L 300 80' };

describe('authorization matrix', () => {
  let app: NestExpressApplication;
  let a: TestCompany;
  let b: TestCompany;
  const sessions = new Map<Caller, Session>();

  async function capturedMailWithAttachment(companyId: string) {
    return withDb(async (db) => {
      const mail = await db.query(
        `insert into captured_mail (company_id, from_address, to_addresses, subject, headers, size_bytes)
         values ($1, 'sender@loamline.example', array['someone@example.net'], 'fixture', '{}'::jsonb, 1) returning id`,
        [companyId],
      );
      const attachment = await db.query(
        `insert into captured_mail_attachments (mail_id, filename, content_type, size_bytes, content)
         values ($1, 'note.txt', 'text/plain', 5, $2) returning id`,
        [mail.rows[0].id, Buffer.from('hello')],
      );
      return { mailId: mail.rows[0].id as string, attachmentId: attachment.rows[0].id as string };
    });
  }

  async function invitationIn(companyId: string) {
    return withDb(async (db) => {
      const { rows } = await db.query(
        `insert into invitations (company_id, email, role, token_hash, expires_at)
         values ($1, $2, 'tech', $3, now() + interval '1 day') returning id`,
        [companyId, `invitee.${randomUUID()}@matrix.example`, randomBytes(16).toString('hex')],
      );
      return rows[0].id as string;
    });
  }

  /** Company A's office, arranging fresh records so that each call stands alone. */
  let arrange: Api;
  let siteA: string;

  async function customerA(): Promise<string> {
    return (await arrange.expectOk('post', '/api/customers', { name: 'Matrix customer' })).id;
  }

  /** If-Match with the site's current version (every site write names it). */
  async function siteIfMatch(siteId: string): Promise<Record<string, string>> {
    return { 'If-Match': `"${await siteVersion(arrange, siteId)}"` };
  }

  /**
   * A fresh site of company A with an open (draft) job led by A's lead: a crew lead changes only the
   * plan and reference points of such a site (issue 18 §2), and no job on it is under review.
   */
  async function leadSiteA(): Promise<string> {
    const { siteId } = await createSite(arrange);
    await createJob(arrange, siteId, { crewLeadUserId: a.users.lead.id });
    return siteId;
  }

  async function referencePointA(siteId: string): Promise<string> {
    return (await siteWrite(arrange, 'post', siteId, '/reference-points', { label: 'Corner', x: 0, y: 0 })).id;
  }

  async function featureA(siteId: string): Promise<string> {
    return (await siteWrite(arrange, 'post', siteId, '/features', { kind: 'fence', name: 'Fence', shape: 'line', points: [{ x: 0, y: 0 }, { x: 5, y: 0 }] })).id;
  }

  /** A draft job on site A led by A's lead with A's tech on the crew. */
  async function draftJobA() {
    return createJob(arrange, siteA, { crewLeadUserId: a.users.lead.id, technicianUserIds: [a.users.tech.id] });
  }

  /** A job in progress with a zone, an amplifier, a speaker, a spare junction, a run, a reading and a check. */
  async function recordedJobA() {
    const job = await insertSmallRecordedJob(a, siteA);
    return {
      base: `/api/jobs/${job.jobId}`,
      headers: { 'If-Match': String(job.version) },
      zone: { id: job.zoneId },
      amp: { id: job.ampId },
      speaker: { id: job.speakerId },
      junction: { id: job.junctionId },
      channel: job.channel,
      run: { id: job.runId },
      runBody: job.runBody,
      reading: { id: job.readingId },
      check: { id: job.checkId },
      checkBody: job.checkBody,
    };
  }

  let photoPng: Buffer;
  let uploadsDir: string;

  /** A photo on a recorded job of company A, uploaded by A's office; with the job's version after it. */
  async function photoA() {
    const r = await recordedJobA();
    const res = await request(app.getHttpServer())
      .post(`${r.base}/photos`)
      .set(bearer(sessions.get('office')!))
      .set(r.headers)
      .attach('files', photoPng, 'matrix.png');
    if (res.status !== 201) throw new Error(`photo upload → ${res.status} ${JSON.stringify(res.body)}`);
    return { id: res.body.photos[0].id as string, headers: { 'If-Match': String(res.body.jobVersion) } };
  }

  const staff = (ok: number, otherCompany = 404) => only(['admin', 'office', 'lead', 'tech'], ok, otherCompany);
  const officeOnly = (ok: number, otherCompany = 404) => only(['admin', 'office'], ok, otherCompany);
  const recorders = (ok: number) => only(['admin', 'office', 'lead'], ok, 404);

  const routes: Record<string, RouteCase> = {
    'GET /api/health': { expect: everyone(200), call: () => ({ path: '/api/health' }) },
    'POST /api/auth/sign-in': {
      expect: everyone(200),
      call: () => ({ path: '/api/auth/sign-in', body: { email: a.users.tech.email, password: TEST_PASSWORD } }),
    },
    'POST /api/auth/refresh': { expect: everyone(401), call: () => ({ path: '/api/auth/refresh' }) },
    'POST /api/auth/sign-out': { expect: everyone(204), call: () => ({ path: '/api/auth/sign-out' }) },
    'GET /api/auth/me': { expect: signedIn(200), call: () => ({ path: '/api/auth/me' }) },
    'GET /api/auth/invitations/:token': {
      expect: everyone(404),
      call: () => ({ path: `/api/auth/invitations/${randomBytes(32).toString('base64url')}` }),
    },
    'POST /api/auth/invitations/accept': {
      expect: everyone(404),
      call: () => ({
        path: '/api/auth/invitations/accept',
        body: { token: randomBytes(32).toString('base64url'), name: 'Someone', password: 'long-enough-password' },
      }),
    },
    'POST /api/auth/password-reset': {
      expect: everyone(202),
      call: () => ({ path: '/api/auth/password-reset', body: { email: `nobody.${randomUUID()}@matrix.example` } }),
    },
    'POST /api/auth/password-reset/confirm': {
      expect: everyone(404),
      call: () => ({
        path: '/api/auth/password-reset/confirm',
        body: { token: randomBytes(32).toString('base64url'), password: 'long-enough-password' },
      }),
    },
    'GET /api/signup/status': { expect: everyone(200), call: () => ({ path: '/api/signup/status' }) },
    'POST /api/signup': {
      // The same answer for everyone; a signed-in caller is treated as a visitor (the route is public).
      expect: everyone(202),
      call: () => ({
        path: '/api/signup',
        body: { companyName: 'Matrix Start-up', name: 'Matrix Founder', email: `founder.${randomUUID()}@matrix.example`, password: 'long-enough-password' },
      }),
    },
    'GET /api/signup/mail/:receipt': {
      expect: everyone(404),
      call: () => ({ path: `/api/signup/mail/${randomBytes(32).toString('base64url')}` }),
    },
    'POST /api/signup/verify': {
      expect: everyone(404),
      call: () => ({ path: '/api/signup/verify', body: { token: randomBytes(32).toString('base64url') } }),
    },
    'GET /api/users': { expect: only(['admin', 'office'], 200, 200), isList: true, call: () => ({ path: '/api/users' }) },
    'PATCH /api/users/:id': {
      expect: only(['admin'], 200, 404),
      call: async () => ({ path: `/api/users/${(await createUser(a.id, 'tech')).id}`, body: { name: 'Renamed Person' } }),
    },
    'GET /api/invitations': {
      expect: only(['admin', 'office'], 200, 200),
      isList: true,
      call: () => ({ path: '/api/invitations' }),
    },
    'POST /api/invitations': {
      expect: only(['admin', 'office'], 201, 201),
      call: () => ({ path: '/api/invitations', body: { email: `new.${randomUUID()}@matrix.example`, role: 'tech' } }),
    },
    'DELETE /api/invitations/:id': {
      expect: only(['admin', 'office'], 204, 404),
      call: async () => ({ path: `/api/invitations/${await invitationIn(a.id)}` }),
    },
    'POST /api/invitations/:id/resend': {
      expect: only(['admin', 'office'], 202, 404),
      call: async () => ({ path: `/api/invitations/${await invitationIn(a.id)}/resend` }),
    },
    'POST /api/analysis': {
      expect: only(['admin', 'office', 'lead', 'tech'], 200, 200),
      call: () => ({ path: '/api/analysis', body: { asBuilt: DEMO_AS_BUILT } }),
    },
    'GET /api/outbox/status': { expect: only(['admin', 'office'], 200, 200), call: () => ({ path: '/api/outbox/status' }) },
    'GET /api/outbox': { expect: only(['admin', 'office'], 200, 200), isList: true, call: () => ({ path: '/api/outbox' }) },
    'GET /api/outbox/:id': {
      expect: only(['admin', 'office'], 200, 404),
      call: async () => ({ path: `/api/outbox/${(await capturedMailWithAttachment(a.id)).mailId}` }),
    },
    'GET /api/outbox/:id/attachments/:attachmentId': {
      expect: only(['admin', 'office'], 200, 404),
      call: async () => {
        const { mailId, attachmentId } = await capturedMailWithAttachment(a.id);
        return { path: `/api/outbox/${mailId}/attachments/${attachmentId}` };
      },
    },
    'GET /api/customers': { expect: staff(200, 200), isList: true, call: () => ({ path: '/api/customers' }) },
    'POST /api/customers': { expect: officeOnly(201, 201), call: () => ({ path: '/api/customers', body: { name: 'New customer' } }) },
    'GET /api/customers/:id': { expect: staff(200), call: async () => ({ path: `/api/customers/${await customerA()}` }) },
    'PATCH /api/customers/:id': {
      expect: officeOnly(200),
      call: async () => ({ path: `/api/customers/${await customerA()}`, body: { phone: '555 0100' } }),
    },
    'DELETE /api/customers/:id': { expect: officeOnly(204), call: async () => ({ path: `/api/customers/${await customerA()}` }) },
    'GET /api/sites': { expect: staff(200, 200), isList: true, call: () => ({ path: '/api/sites' }) },
    // Another company naming A's customer is refused as a bad reference (400), never created.
    'POST /api/sites': {
      expect: officeOnly(201, 400),
      call: async () => ({
        path: '/api/sites',
        body: { customerId: await customerA(), label: 'Yard', addressLine1: '1 Nowhere Way', city: 'Fableford', country: 'Testland' },
      }),
    },
    'GET /api/sites/:id': { expect: staff(200), call: () => ({ path: `/api/sites/${siteA}` }) },
    'PATCH /api/sites/:id': {
      expect: officeOnly(200),
      call: async () => ({ path: `/api/sites/${siteA}`, body: { notes: 'Dog in the yard' }, headers: await siteIfMatch(siteA) }),
    },
    'DELETE /api/sites/:id': {
      expect: officeOnly(204),
      call: async () => ({ path: `/api/sites/${(await createSite(arrange)).siteId}` }),
    },
    // Site geometry: the office, and a crew lead on an open job's crew at the site (leadSiteA).
    'POST /api/sites/:siteId/reference-points': {
      expect: recorders(201),
      call: async () => {
        const siteId = await leadSiteA();
        return { path: `/api/sites/${siteId}/reference-points`, body: { label: 'Gate post', x: 3, y: 4 }, headers: await siteIfMatch(siteId) };
      },
    },
    'PATCH /api/sites/:siteId/reference-points/:pointId': {
      expect: recorders(200),
      call: async () => {
        const siteId = await leadSiteA();
        const pointId = await referencePointA(siteId);
        return { path: `/api/sites/${siteId}/reference-points/${pointId}`, body: { x: 1 }, headers: await siteIfMatch(siteId) };
      },
    },
    'DELETE /api/sites/:siteId/reference-points/:pointId': {
      expect: recorders(200),
      call: async () => {
        const siteId = await leadSiteA();
        const pointId = await referencePointA(siteId);
        return { path: `/api/sites/${siteId}/reference-points/${pointId}`, headers: await siteIfMatch(siteId) };
      },
    },
    // Site features (issue 15): staff read; the office and a crew lead on an open job's crew draw them.
    'GET /api/sites/:siteId/features': { expect: staff(200), call: () => ({ path: `/api/sites/${siteA}/features` }) },
    'POST /api/sites/:siteId/features': {
      expect: recorders(201),
      call: async () => {
        const siteId = await leadSiteA();
        return {
          path: `/api/sites/${siteId}/features`,
          body: { kind: 'patio', name: 'Patio', shape: 'polygon', points: [{ x: 0, y: 0 }, { x: 4, y: 0 }, { x: 4, y: 3 }] },
          headers: await siteIfMatch(siteId),
        };
      },
    },
    'PATCH /api/sites/:siteId/features/:featureId': {
      expect: recorders(200),
      call: async () => {
        const siteId = await leadSiteA();
        const featureId = await featureA(siteId);
        return { path: `/api/sites/${siteId}/features/${featureId}`, body: { name: 'North fence' }, headers: await siteIfMatch(siteId) };
      },
    },
    'DELETE /api/sites/:siteId/features/:featureId': {
      expect: recorders(200),
      call: async () => {
        const siteId = await leadSiteA();
        const featureId = await featureA(siteId);
        return { path: `/api/sites/${siteId}/features/${featureId}`, headers: await siteIfMatch(siteId) };
      },
    },
    'POST /api/sites/:siteId/homeowners': {
      expect: officeOnly(201),
      call: () => ({ path: `/api/sites/${siteA}/homeowners`, body: { userId: a.users.homeowner.id } }),
    },
    'DELETE /api/sites/:siteId/homeowners/:userId': {
      expect: officeOnly(204),
      call: async () => {
        const { siteId } = await createSite(arrange);
        await arrange.expectOk('post', `/api/sites/${siteId}/homeowners`, { userId: a.users.homeowner.id });
        return { path: `/api/sites/${siteId}/homeowners/${a.users.homeowner.id}` };
      },
    },
    'POST /api/sites/:siteId/homeowner-invitations': {
      expect: officeOnly(201),
      call: () => ({ path: `/api/sites/${siteA}/homeowner-invitations`, body: { email: `owner.${randomUUID()}@matrix.example` } }),
    },
    // Each caller reads and changes only their own company's settings and their own preferences.
    'GET /api/company/settings': { expect: signedIn(200), call: () => ({ path: '/api/company/settings' }) },
    'PATCH /api/company/settings': {
      expect: only(['admin'], 200, 200),
      call: () => ({ path: '/api/company/settings', body: { paperSize: 'letter' } }),
    },
    'GET /api/me/preferences': { expect: signedIn(200), call: () => ({ path: '/api/me/preferences' }) },
    // The company profile: the admin writes it, the office reads it; each company's admin reaches only their own.
    'GET /api/company/profile': { expect: only(['admin', 'office'], 200, 200), call: () => ({ path: '/api/company/profile' }) },
    'PATCH /api/company/profile': {
      expect: only(['admin'], 200, 200),
      call: () => ({ path: '/api/company/profile', body: { phone: '(555) 010-0150', timeZone: 'America/Denver' } }),
    },
    'PUT /api/company/profile/logo': {
      expect: only(['admin'], 200, 200),
      call: () => ({ path: '/api/company/profile/logo', files: [{ field: 'file', name: 'logo.png', content: photoPng }] }),
    },
    // Both companies have a logo (arranged through each admin), so B's admin gets B's own.
    'GET /api/company/profile/logo': {
      expect: only(['admin', 'office'], 200, 200),
      call: async () => {
        await logosOfBothCompanies();
        return { path: '/api/company/profile/logo' };
      },
    },
    'DELETE /api/company/profile/logo': {
      expect: only(['admin'], 200, 200),
      call: async () => {
        await logosOfBothCompanies();
        return { path: '/api/company/profile/logo' };
      },
    },
    'GET /api/company/depth-rules': { expect: only(['admin', 'office'], 200, 200), call: () => ({ path: '/api/company/depth-rules' }) },
    'PUT /api/company/depth-rules': {
      expect: only(['admin'], 200, 200),
      call: () => ({ path: '/api/company/depth-rules', body: DEFAULT_DEPTH_RULES }),
    },
    'DELETE /api/company/depth-rules': { expect: only(['admin'], 200, 200), call: () => ({ path: '/api/company/depth-rules' }) },
    'PATCH /api/me/preferences': { expect: signedIn(200), call: () => ({ path: '/api/me/preferences', body: { lengthUnits: null } }) },
    'GET /api/jobs': { expect: staff(200, 200), isList: true, call: () => ({ path: '/api/jobs' }) },
    'POST /api/jobs': {
      expect: officeOnly(201, 400),
      call: () => ({ path: '/api/jobs', body: { siteId: siteA, title: 'Matrix job' } }),
    },
    'GET /api/jobs/:id': { expect: staff(200), call: async () => ({ path: `/api/jobs/${(await draftJobA()).id}` }) },
    'GET /api/jobs/:id/as-built': { expect: staff(200), call: async () => ({ path: `/api/jobs/${(await draftJobA()).id}/as-built` }) },
    'PATCH /api/jobs/:id': {
      expect: officeOnly(200),
      call: async () => ({ path: `/api/jobs/${(await draftJobA()).id}`, body: { title: 'Renamed' }, headers: { 'If-Match': '1' } }),
    },
    'DELETE /api/jobs/:id': {
      expect: officeOnly(204),
      call: async () => ({ path: `/api/jobs/${(await draftJobA()).id}`, headers: { 'If-Match': '1' } }),
    },
    'POST /api/jobs/:id/status': {
      expect: recorders(200),
      call: async () => {
        const job = await moveJob(arrange, await draftJobA(), 'in_progress');
        return { path: `/api/jobs/${job.id}/status`, body: { to: 'submitted', expectedVersion: job.version } };
      },
    },
    'POST /api/jobs/:jobId/zones': {
      expect: recorders(201),
      call: async () => {
        const r = await recordedJobA();
        return { path: `${r.base}/zones`, body: { name: 'Spa' }, headers: r.headers };
      },
    },
    'PATCH /api/jobs/:jobId/zones/:zoneId': {
      expect: recorders(200),
      call: async () => {
        const r = await recordedJobA();
        return { path: `${r.base}/zones/${r.zone.id}`, body: { name: 'Terrace' }, headers: r.headers };
      },
    },
    'DELETE /api/jobs/:jobId/zones/:zoneId': {
      expect: recorders(200),
      call: async () => {
        const r = await recordedJobA();
        return { path: `${r.base}/zones/${r.zone.id}`, headers: r.headers };
      },
    },
    'POST /api/jobs/:jobId/items': {
      expect: recorders(201),
      call: async () => {
        const r = await recordedJobA();
        return { path: `${r.base}/items`, body: { kind: 'spare_end', label: 'Spare end', isCapped: true }, headers: r.headers };
      },
    },
    'PUT /api/jobs/:jobId/items/:itemId': {
      expect: recorders(200),
      call: async () => {
        const r = await recordedJobA();
        return { path: `${r.base}/items/${r.speaker.id}`, body: { kind: 'speaker', label: 'Satellite S1', nominalImpedanceOhm: 8 }, headers: r.headers };
      },
    },
    'DELETE /api/jobs/:jobId/items/:itemId': {
      expect: recorders(200),
      call: async () => {
        const r = await recordedJobA();
        return { path: `${r.base}/items/${r.junction.id}`, headers: r.headers };
      },
    },
    'PUT /api/jobs/:jobId/items/:itemId/channels/:channelId/setup': {
      expect: recorders(200),
      call: async () => {
        const r = await recordedJobA();
        return { path: `${r.base}/items/${r.amp.id}/channels/${r.channel.channelId}/setup`, body: { gain: '-6 dB' }, headers: r.headers };
      },
    },
    'POST /api/jobs/:jobId/runs': {
      expect: recorders(201),
      call: async () => {
        const r = await recordedJobA();
        return { path: `${r.base}/runs`, body: { ...r.runBody, toItemId: r.junction.id, pairs: [{ pairIndex: 1, channel: null }], isSpare: true }, headers: r.headers };
      },
    },
    'PUT /api/jobs/:jobId/runs/:runId': {
      expect: recorders(200),
      call: async () => {
        const r = await recordedJobA();
        return { path: `${r.base}/runs/${r.run.id}`, body: { ...r.runBody, measuredLengthM: 11 }, headers: r.headers };
      },
    },
    'DELETE /api/jobs/:jobId/runs/:runId': {
      expect: recorders(200),
      call: async () => {
        const r = await recordedJobA();
        return { path: `${r.base}/runs/${r.run.id}`, headers: r.headers };
      },
    },
    'DELETE /api/jobs/:jobId/site-changes/:recordId': {
      expect: recorders(200),
      call: async () => {
        const change = await insertSiteChange(a, siteA);
        return { path: `/api/jobs/${change.jobId}/site-changes/${change.recordId}`, headers: { 'If-Match': String(change.version) } };
      },
    },
    'POST /api/jobs/:jobId/runs/:runId/depth-readings': {
      expect: staff(201),
      call: async () => {
        const r = await recordedJobA();
        return { path: `${r.base}/runs/${r.run.id}/depth-readings`, body: { stationM: 4, depthM: 0.25 }, headers: r.headers };
      },
    },
    'PATCH /api/jobs/:jobId/runs/:runId/depth-readings/:readingId': {
      expect: staff(200),
      call: async () => {
        const r = await recordedJobA();
        return { path: `${r.base}/runs/${r.run.id}/depth-readings/${r.reading.id}`, body: { depthM: 0.28 }, headers: r.headers };
      },
    },
    'DELETE /api/jobs/:jobId/runs/:runId/depth-readings/:readingId': {
      expect: staff(200),
      call: async () => {
        const r = await recordedJobA();
        return { path: `${r.base}/runs/${r.run.id}/depth-readings/${r.reading.id}`, headers: r.headers };
      },
    },
    'POST /api/jobs/:jobId/checks': {
      expect: staff(201),
      call: async () => {
        const r = await recordedJobA();
        return { path: `${r.base}/checks`, body: { ...r.checkBody, quantity: 'impedance', measuredOhm: 8.3 }, headers: r.headers };
      },
    },
    'PUT /api/jobs/:jobId/checks/:checkId': {
      expect: staff(200),
      call: async () => {
        const r = await recordedJobA();
        return { path: `${r.base}/checks/${r.check.id}`, body: { ...r.checkBody, measuredOhm: 6.9 }, headers: r.headers };
      },
    },
    'DELETE /api/jobs/:jobId/checks/:checkId': {
      expect: staff(200),
      call: async () => {
        const r = await recordedJobA();
        return { path: `${r.base}/checks/${r.check.id}`, headers: r.headers };
      },
    },
    'GET /api/jobs/:jobId/photos': {
      expect: staff(200),
      call: async () => ({ path: `${(await recordedJobA()).base}/photos` }),
    },
    'POST /api/jobs/:jobId/photos': {
      expect: staff(201),
      call: async () => {
        const r = await recordedJobA();
        return { path: `${r.base}/photos`, headers: r.headers, body: { caption: 'Trench' }, files: [{ field: 'files', name: 'trench.png', content: photoPng }] };
      },
    },
    'PUT /api/sites/:siteId/plan-image': {
      expect: recorders(200),
      call: async () => {
        const siteId = await leadSiteA();
        return { path: `/api/sites/${siteId}/plan-image`, headers: await siteIfMatch(siteId), files: [{ field: 'file', name: 'plan.png', content: photoPng }] };
      },
    },
    'GET /api/sites/:siteId/plan-image': {
      expect: { ...staff(200), homeowner: 200 },
      call: async () => ({ path: `/api/sites/${await sitePlanImageA()}/plan-image` }),
    },
    'DELETE /api/sites/:siteId/plan-image': {
      expect: recorders(200),
      call: async () => {
        const siteId = await sitePlanImageA();
        return { path: `/api/sites/${siteId}/plan-image`, headers: await siteIfMatch(siteId) };
      },
    },
    'GET /api/jobs/:id/drawings/site-plan.svg': {
      expect: staff(200),
      call: async () => ({ path: `${(await recordedJobA()).base}/drawings/site-plan.svg` }),
    },
    'GET /api/jobs/:id/drawings/schematic.svg': {
      expect: staff(200),
      call: async () => ({ path: `${(await recordedJobA()).base}/drawings/schematic.svg` }),
    },
    'GET /api/jobs/:id/drawings/runs/:runId/depth-profile.svg': {
      expect: staff(200),
      call: async () => {
        const r = await recordedJobA();
        return { path: `${r.base}/drawings/runs/${r.run.id}/depth-profile.svg` };
      },
    },
    'GET /api/photos/:id/:variant': {
      expect: staff(200),
      call: async () => ({ path: `/api/photos/${(await photoA()).id}/thumb` }),
    },
    'PATCH /api/photos/:id': {
      expect: staff(200),
      call: async () => {
        const p = await photoA();
        return { path: `/api/photos/${p.id}`, body: { caption: 'Wall entry' }, headers: p.headers };
      },
    },
    'DELETE /api/photos/:id': {
      expect: staff(200),
      call: async () => {
        const p = await photoA();
        return { path: `/api/photos/${p.id}`, headers: p.headers };
      },
    },
    'POST /api/photos/:id/restore': {
      expect: staff(200),
      call: async () => {
        const p = await photoA();
        const deleted = await arrange.expectOk('delete', `/api/photos/${p.id}`, undefined, p.headers);
        return { path: `/api/photos/${p.id}/restore`, headers: { 'If-Match': String(deleted.jobVersion) } };
      },
    },
    'POST /api/jobs/:jobId/packets': {
      expect: officeOnly(201),
      call: async () => {
        const job = await readyToIssueJobA();
        return { path: `/api/jobs/${job.id}/packets`, headers: { 'If-Match': String(job.version) } };
      },
    },
    'GET /api/jobs/:jobId/signatures': {
      expect: staff(200),
      isList: true,
      call: async () => {
        const job = await signedJobA();
        return { path: `/api/jobs/${job.id}/signatures` };
      },
    },
    'PUT /api/jobs/:jobId/signatures/:role': {
      expect: only(['admin', 'office', 'lead'], 200, 404),
      call: async () => {
        const job = await readyToIssueJobA();
        return { path: `/api/jobs/${job.id}/signatures/homeowner`, body: SIGNATURE_BODY, headers: { 'If-Match': String(job.version) } };
      },
    },
    'DELETE /api/jobs/:jobId/signatures/:role': {
      expect: only(['admin', 'office', 'lead'], 200, 404),
      call: async () => {
        const job = await signedJobA();
        return { path: `/api/jobs/${job.id}/signatures/homeowner`, headers: { 'If-Match': String(job.version) } };
      },
    },
    'GET /api/jobs/:jobId/packets': {
      expect: staff(200),
      isList: true,
      call: async () => ({ path: `/api/jobs/${(await readyPacketA()).jobId}/packets` }),
    },
    'GET /api/packets/:id': { expect: staff(200), call: async () => ({ path: `/api/packets/${(await readyPacketA()).id}` }) },
    'GET /api/packets/:id/pdf': { expect: staff(200), call: async () => ({ path: `/api/packets/${(await readyPacketA()).id}/pdf` }) },
    'GET /api/packets/:id/archive.zip': {
      expect: staff(200),
      call: async () => ({ path: `/api/packets/${(await readyPacketA()).id}/archive.zip` }),
    },
    // siteA's homeowner is A's homeowner (linked in beforeAll), so a send has a recipient.
    'POST /api/packets/:id/send': {
      expect: officeOnly(202),
      call: async () => ({ path: `/api/packets/${(await readyPacketA()).id}/send`, body: { message: 'Matrix send' } }),
    },
    'GET /api/packets/:id/deliveries': {
      expect: officeOnly(200),
      call: async () => ({ path: `/api/packets/${(await readyPacketA()).id}/deliveries` }),
    },
    'GET /api/packets/:id/send-options': {
      expect: officeOnly(200),
      isList: true,
      call: async () => ({ path: `/api/packets/${(await readyPacketA()).id}/send-options` }),
    },
    'GET /api/jobs/:jobId/deliveries': {
      expect: officeOnly(200),
      isList: true,
      call: async () => ({ path: `/api/jobs/${(await failedDeliveryA()).jobId}/deliveries` }),
    },
    // Company B's admin gets B's own (empty) list: nothing of A's.
    'GET /api/deliveries/failed': {
      expect: officeOnly(200, 200),
      isList: true,
      call: async () => {
        await failedDeliveryA();
        return { path: '/api/deliveries/failed' };
      },
    },
    'POST /api/deliveries/:id/resend': {
      expect: officeOnly(202),
      call: async () => ({ path: `/api/deliveries/${(await failedDeliveryA()).id}/resend` }),
    },
    'POST /api/deliveries/:id/dismiss': {
      expect: officeOnly(200),
      call: async () => ({ path: `/api/deliveries/${(await failedDeliveryA()).id}/dismiss` }),
    },
    'POST /api/sites/:siteId/locate-links': {
      expect: only(['admin', 'office', 'homeowner'], 201, 404),
      call: () => ({ path: `/api/sites/${siteA}/locate-links`, body: { expiresInDays: 7, note: 'Matrix' } }),
    },
    'GET /api/sites/:siteId/locate-links': {
      expect: only(['admin', 'office', 'homeowner'], 200, 404),
      call: () => ({ path: `/api/sites/${siteA}/locate-links` }),
    },
    'DELETE /api/locate-links/:id': {
      expect: only(['admin', 'office', 'homeowner'], 204, 404),
      call: async () => ({ path: `/api/locate-links/${(await locateLinkA()).id}` }),
    },
    // Homeowners only: staff of any company are refused by role (403) before any record is looked at.
    'GET /api/portal/sites': { expect: only(['homeowner'], 200, 403), isList: true, call: () => ({ path: '/api/portal/sites' }) },
    'GET /api/portal/sites/:siteId': { expect: only(['homeowner'], 200, 403), call: () => ({ path: `/api/portal/sites/${siteA}` }) },
    'GET /api/portal/sites/:siteId/map': { expect: only(['homeowner'], 200, 403), call: () => ({ path: `/api/portal/sites/${siteA}/map` }) },
    'GET /api/portal/packets/:id/pdf': {
      expect: only(['homeowner'], 200, 403),
      call: async () => ({ path: `/api/portal/packets/${(await readyPacketA()).id}/pdf` }),
    },
    'GET /api/portal/packets/:id/archive.zip': {
      expect: only(['homeowner'], 200, 403),
      call: async () => ({ path: `/api/portal/packets/${(await readyPacketA()).id}/archive.zip` }),
    },
    // Public with a valid token (a bad one is 404 LOCATE_LINK_NOT_VALID: locate.int.spec.ts).
    'GET /api/locate/:token': { expect: everyone(200), call: async () => ({ path: `/api/locate/${(await locateLinkA()).token}` }) },
    'GET /api/locate/:token/map.geojson': {
      expect: everyone(200),
      call: async () => ({ path: `/api/locate/${(await locateLinkA()).token}/map.geojson` }),
    },
    'GET /api/locate/:token/sheet.pdf': {
      expect: everyone(200),
      call: async () => ({ path: `/api/locate/${(await locateLinkA()).token}/sheet.pdf` }),
    },
    'GET /api/locate/:token/runs/:runId/depth-profile.svg': {
      expect: everyone(200),
      call: async () => ({ path: `/api/locate/${(await locateLinkA()).token}/runs/${DEMO_AS_BUILT.runs[0]!.id}/depth-profile.svg` }),
    },
    'GET /api/locate/:token/photos/:photoId/:variant': {
      expect: everyone(200),
      call: async () => ({ path: `/api/locate/${(await locateLinkA()).token}/photos/${await trenchPhotoA()}/thumb` }),
    },
  };

  /** Uploads a logo for company A and for company B through their admins. */
  async function logosOfBothCompanies(): Promise<void> {
    for (const caller of ['admin', 'otherCompany'] as const) {
      const res = await request(app.getHttpServer()).put('/api/company/profile/logo').set(bearer(sessions.get(caller)!)).attach('file', photoPng, 'logo.png');
      if (res.status !== 200) throw new Error(`logo upload → ${res.status} ${JSON.stringify(res.body)}`);
    }
  }

  /** A fresh locate link of site A (made by A's office), with its token. */
  async function locateLinkA(): Promise<{ id: string; token: string }> {
    return arrange.expectOk('post', `/api/sites/${siteA}/locate-links`, { expiresInDays: 1 });
  }

  /** A photo on a run of a job of site A that has a ready revision (so the public view may show it). */
  async function trenchPhotoA(): Promise<string> {
    const r = await recordedJobA();
    const res = await request(app.getHttpServer())
      .post(`${r.base}/photos`)
      .set(bearer(sessions.get('office')!))
      .set(r.headers)
      .field('target', JSON.stringify({ type: 'run', id: r.run.id }))
      .attach('files', photoPng, 'trench.png');
    if (res.status !== 201) throw new Error(`photo upload → ${res.status} ${JSON.stringify(res.body)}`);
    await insertReadyRevision(r.base.split('/').pop()!, { snapshot: {} });
    return res.body.photos[0].id as string;
  }

  /** A fresh site of company A with a plan image and an open job led by A's lead, linked to A's homeowner. */
  async function sitePlanImageA(): Promise<string> {
    const siteId = await leadSiteA();
    await arrange.expectOk('post', `/api/sites/${siteId}/homeowners`, { userId: a.users.homeowner.id });
    const res = await request(app.getHttpServer())
      .put(`/api/sites/${siteId}/plan-image`)
      .set(bearer(sessions.get('office')!))
      .set(await siteIfMatch(siteId))
      .attach('file', photoPng, 'plan.png');
    if (res.status !== 200) throw new Error(`plan image upload → ${res.status} ${JSON.stringify(res.body)}`);
    return siteId;
  }

  /** Stand-in ready revision rows (files that are never read) for a job of company A. */
  async function insertReadyRevision(jobId: string, { snapshot }: { snapshot: object }) {
    await withDb((db) =>
      db.query(
        `insert into packet_revisions (company_id, job_id, revision, status, snapshot, paper_size, pdf_key, pdf_sha256, zip_key, zip_sha256, attempts)
         values ($1, $2, 1, 'ready', $3, 'letter', 'stand-in.pdf', $4, 'stand-in.zip', $4, 1)`,
        [a.id, jobId, JSON.stringify(snapshot), '0'.repeat(64)],
      ),
    );
  }

  /** A recorded job of company A moved straight to ready to issue (version 1). */
  async function readyToIssueJobA() {
    const job = await insertRecordedJob(a, siteA, { crewLeadUserId: a.users.lead.id, technicianUserIds: [] }, DEMO_AS_BUILT);
    await withDb((db) => db.query(`update jobs set status = 'ready_to_issue' where id = $1`, [job.id]));
    return job;
  }

  /** A ready-to-issue job of company A with the homeowner's signature saved; `version` is current. */
  async function signedJobA() {
    const job = await readyToIssueJobA();
    const saved = await arrange.expectOk('put', `/api/jobs/${job.id}/signatures/homeowner`, SIGNATURE_BODY, { 'If-Match': String(job.version) });
    return { id: job.id, version: saved.jobVersion as number };
  }

  /** An issued job of company A with a ready packet revision whose (stand-in) files are stored. */
  async function readyPacketA(): Promise<{ id: string; jobId: string }> {
    const job = await readyToIssueJobA();
    const storage = new DiskStorage(uploadsDir);
    const id = randomUUID();
    const pdf = await storage.put(`companies/${a.id}/packets/${id}/packet-rev-1.pdf`, Buffer.from('%PDF-1.4 matrix'), 'application/pdf');
    const zip = await storage.put(`companies/${a.id}/packets/${id}/packet-rev-1.zip`, Buffer.from('PK matrix'), 'application/zip');
    await withDb(async (db) => {
      await db.query(`update jobs set status = 'issued' where id = $1`, [job.id]);
      await db.query(
        `insert into packet_revisions (id, company_id, job_id, revision, status, snapshot, paper_size, pdf_key, pdf_bytes, pdf_sha256, page_count, zip_key, zip_bytes, zip_sha256, attempts)
         values ($1, $2, $3, 1, 'ready', '{}'::jsonb, 'letter', $4, $5, $6, 1, $7, $8, $9, 1)`,
        [id, a.id, job.id, pdf.key, pdf.bytes, pdf.sha256, zip.key, zip.bytes, zip.sha256],
      );
    });
    return { id, jobId: job.id };
  }

  /** A failed packet e-mail of company A to A's homeowner, on a fresh ready revision. */
  async function failedDeliveryA(): Promise<{ id: string; jobId: string }> {
    const packet = await readyPacketA();
    const id = await withDb(async (db) => {
      const { rows } = await db.query(
        `insert into packet_deliveries (company_id, revision_id, to_address, status, attempts, last_error)
         values ($1, $2, $3, 'failed', 3, 'connect ECONNREFUSED 127.0.0.1:2525') returning id`,
        [a.id, packet.id, a.users.homeowner.email],
      );
      return rows[0].id as string;
    });
    return { id, jobId: packet.jobId };
  }

  beforeAll(async () => {
    uploadsDir = await mkdtemp(join(tmpdir(), 'loamline-matrix-uploads-'));
    photoPng = await makePng();
    app = await createTestApp({ override: (builder) => builder.overrideProvider(OBJECT_STORAGE).useValue(new DiskStorage(uploadsDir)) });
    a = await createCompany('Matrix A');
    b = await createCompany('Matrix B');
    for (const role of ROLES) sessions.set(role, await signIn(app, a.users[role]));
    sessions.set('otherCompany', await signIn(app, b.users.admin));
    await invitationIn(a.id);
    await capturedMailWithAttachment(a.id);
    arrange = apiAs(app, sessions.get('office')!);
    siteA = (await createSite(arrange)).siteId;
    await draftJobA();
    await arrange.expectOk('post', `/api/sites/${siteA}/homeowners`, { userId: a.users.homeowner.id });
    // An issued revision with the demo as-built (GPS origin, depth readings), for the public locate routes.
    const demoJob = await insertRecordedJob(a, siteA, { crewLeadUserId: a.users.lead.id, technicianUserIds: [] }, DEMO_AS_BUILT);
    await insertReadyRevision(demoJob.id, {
      snapshot: { asBuilt: DEMO_AS_BUILT, analysis: analyzeAsBuilt(DEMO_AS_BUILT), settings: { units: 'metric', paperSize: 'letter', licenceNumbers: [], contactPhone: null, contactEmail: null } },
    });
  });

  afterAll(async () => {
    await app.close();
    await rm(uploadsDir, { recursive: true, force: true });
  });

  it('should cover exactly the routes the API serves', () => {
    const express = app.getHttpAdapter().getInstance() as { router: { stack: { route?: { path: string; methods: Record<string, boolean> } }[] } };
    const served = express.router.stack
      .flatMap((layer) => (layer.route ? Object.keys(layer.route.methods).map((m) => `${m.toUpperCase()} ${layer.route!.path}`) : []))
      .filter((route) => !/ \/api\/docs/.test(route));
    expect(new Set(served)).toEqual(new Set(Object.keys(routes)));
  });

  // Dealt out over this file and authorization-matrix.part-*.int.spec.ts, which run in parallel.
  describe.each(thisPartOf(import.meta.url, Object.entries(routes)))('%s', (route, spec) => {
    const method = route.split(' ')[0]!.toLowerCase() as 'get' | 'post' | 'patch' | 'delete' | 'put';
    // A refused call changes nothing, so the refused callers of a route can share one arranged record.
    let refusedCall: Promise<Call> | undefined;

    it.each(CALLERS)('as %s', async (caller) => {
      const isRefused = spec.expect[caller] >= 400;
      const { path, body, headers, files } = await (isRefused ? (refusedCall ??= Promise.resolve(spec.call())) : spec.call());
      let req = request(app.getHttpServer())[method](path);
      for (const [name, value] of Object.entries(headers ?? {})) req = req.set(name, value);
      const session = sessions.get(caller);
      if (session) req = req.set(bearer(session));
      if (files) {
        for (const [name, value] of Object.entries(body ?? {})) req = req.field(name, String(value));
        for (const file of files) req = req.attach(file.field, file.content, file.name);
      }
      const res = files ? await req : body ? await req.send(body) : await req;
      expect(res.status, JSON.stringify(res.body)).toBe(spec.expect[caller]);
      if (caller === 'otherCompany' && spec.isList) {
        const text = JSON.stringify(res.body);
        for (const user of Object.values(a.users)) {
          expect(text).not.toContain(user.id);
          expect(text).not.toContain(user.email);
        }
        expect(text).not.toContain(a.id);
      }
    });
  });
});
