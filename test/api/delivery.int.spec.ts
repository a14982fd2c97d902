import { createHash, randomBytes, randomUUID } from 'node:crypto';
import { mkdtempSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

import type { NestExpressApplication } from '@nestjs/platform-express';
import { SMTPServer } from 'smtp-server';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';

import { DEMO_AS_BUILT } from '../../api/src/domain/as-built/demo-as-built.js';
import { DeliveryInContextSchema, PacketDeliveryResponseSchema } from '../../api/src/domain/delivery/delivery.schema.js';
import { DiskStorage } from '../../api/src/storage/disk-storage.js';
import { createCompany, type TestCompany, withDb } from '../support/fixtures.js';
import { countMail, findLink } from '../support/mail.js';
import { type Api, apiAs, createSite, insertRecordedJob } from '../support/records.js';
import { signIn } from '../support/session.js';

const UPLOADS_DIR = mkdtempSync(join(tmpdir(), 'loamline-delivery-uploads-'));

// ConfigModule reads the environment when AppModule is imported; each describe below re-imports the
// app (vi.resetModules) after adjusting these, so one file can run differently configured apps.
const BASE_ENV = {
  PACKET_WORKER_IN_API: 'false',
  QUEUE_POLL_INTERVAL_SECONDS: '0.5',
  UPLOADS_DIR,
  APP_URL: 'https://loamline.example',
  PACKET_SEND_RETRIES: '2',
  PACKET_SEND_RETRY_DELAY_SECONDS: '1',
};

async function startApp(env: Record<string, string | undefined>): Promise<NestExpressApplication> {
  for (const [key, value] of Object.entries({ ...BASE_ENV, ...env })) {
    if (value === undefined) delete process.env[key];
    else process.env[key] = value;
  }
  vi.resetModules();
  const { createTestApp } = await import('../support/test-app.js');
  return createTestApp();
}

/** A port nothing listens on (taken from the OS, then released). */
async function closedPort(): Promise<number> {
  const server = createServer();
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const { port } = server.address() as { port: number };
  await new Promise<void>((resolve) => server.close(() => resolve()));
  return port;
}

/**
 * A site with an issued job and a ready revision whose (stand-in) PDF and archive are stored where the
 * app reads them; rendering is covered by packets.int.spec.ts and locate.int.spec.ts.
 */
async function readyPacket(company: TestCompany, office: Api, pdfBytes = 40_000) {
  const { siteId } = await createSite(office, DEMO_AS_BUILT.site);
  const job = await insertRecordedJob(company, siteId, { crewLeadUserId: company.users.lead.id, technicianUserIds: [] }, DEMO_AS_BUILT);
  const storage = new DiskStorage(UPLOADS_DIR);
  const id = randomUUID();
  const pdfBody = Buffer.concat([Buffer.from('%PDF-1.7\n'), randomBytes(pdfBytes)]);
  const pdf = await storage.put(`companies/${company.id}/packets/${id}/packet-rev-1.pdf`, pdfBody, 'application/pdf');
  const zip = await storage.put(`companies/${company.id}/packets/${id}/packet-rev-1.zip`, Buffer.from('PK stand-in'), 'application/zip');
  const snapshot = { analysis: { summary: { runCount: 6, itemCount: 9, critical: 0, warning: 2, info: 1, totalCableM: 80 } } };
  await withDb(async (db) => {
    await db.query(`update jobs set status = 'issued' where id = $1`, [job.id]);
    await db.query(
      `insert into packet_revisions (id, company_id, job_id, revision, status, snapshot, paper_size, pdf_key, pdf_bytes, pdf_sha256, page_count, zip_key, zip_bytes, zip_sha256, attempts)
       values ($1, $2, $3, 1, 'ready', $4, 'letter', $5, $6, $7, 14, $8, $9, $10, 1)`,
      [id, company.id, job.id, JSON.stringify(snapshot), pdf.key, pdf.bytes, pdf.sha256, zip.key, zip.bytes, zip.sha256],
    );
  });
  return { id, siteId, jobId: job.id, pdfSha256: pdf.sha256 };
}

async function waitForDelivery(api: Api, revisionId: string, deliveryId: string, statuses: string[], timeoutMs = 30_000) {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const list = await api.expectOk('get', `/api/packets/${revisionId}/deliveries`);
    const delivery = list.find((d: { id: string }) => d.id === deliveryId);
    if (delivery && statuses.includes(delivery.status)) return PacketDeliveryResponseSchema.parse(delivery);
    if (Date.now() > deadline) throw new Error(`delivery ${deliveryId} still ${delivery?.status} after ${timeoutMs} ms`);
    await new Promise((resolve) => setTimeout(resolve, 250));
  }
}

async function packetMail(to: string) {
  return withDb(async (db) => {
    const { rows } = await db.query(
      `select id, to_addresses, subject, text, html from captured_mail where $1 = any(to_addresses) and subject like 'Your handover packet%' order by received_at desc limit 1`,
      [to],
    );
    if (!rows[0]) return undefined;
    const attachments = await db.query('select filename, content_type, content from captured_mail_attachments where mail_id = $1', [rows[0].id]);
    return { ...rows[0], attachments: attachments.rows as { filename: string; content_type: string; content: Buffer }[] };
  });
}

describe('sending packets (local SMTP capture server)', () => {
  let app: NestExpressApplication;
  let company: TestCompany;
  let office: Api;

  beforeAll(async () => {
    app = await startApp({ SMTP_URL: undefined, MAIL_MAX_ATTACHMENT_BYTES: undefined });
    company = await createCompany('Delivery');
    office = apiAs(app, await signIn(app, company.users.office));
  });

  afterAll(async () => {
    await app?.close();
  });

  it('should e-mail two recipients, the new one with the portal invitation in the same e-mail, and link the site when they accept', async () => {
    const packet = await readyPacket(company, office);
    const noRecipient = await office.send('post', `/api/packets/${packet.id}/send`, {});
    expect(noRecipient.status).toBe(422);
    expect(noRecipient.body.code).toBe('NO_RECIPIENT');

    // The dialog starts from the site's homeowners: the linked account.
    await office.expectOk('post', `/api/sites/${packet.siteId}/homeowners`, { userId: company.users.homeowner.id });
    const options = await office.expectOk('get', `/api/packets/${packet.id}/send-options`);
    expect(options).toEqual({
      homeowners: [{ email: company.users.homeowner.email, name: expect.any(String), hasAccount: true }],
      pdfBytes: expect.any(Number),
      maxAttachmentBytes: 10 * 1024 * 1024,
      canAttachPdf: true,
    });

    const email = `new.owner.${randomUUID().slice(0, 8)}@delivery.example`;
    const invitationMailsBefore = await countMail(email);
    const res = await office.send('post', `/api/packets/${packet.id}/send`, {
      to: [company.users.homeowner.email, email],
      cc: ['Neighbour@Delivery.example'],
      message: 'Thanks for having us!',
      pdf: 'attached',
    });
    expect(res.status, JSON.stringify(res.body)).toBe(202);
    expect(res.body.deliveries).toHaveLength(2);
    const byAddress = new Map(res.body.deliveries.map((d: { to: string }) => [d.to, d]));
    expect(byAddress.get(company.users.homeowner.email)).toMatchObject({ status: 'queued', isInvited: false, pdf: 'attached', cc: ['neighbour@delivery.example'] });
    expect(byAddress.get(email)).toMatchObject({ status: 'queued', isInvited: true, pdf: 'attached' });

    for (const d of res.body.deliveries) {
      const sent = await waitForDelivery(office, packet.id, d.id, ['sent', 'failed']);
      expect(sent).toMatchObject({ status: 'sent', attempts: 1, isPdfAttached: true, lastError: null, failureReason: null });
      expect(sent.messageId).toMatch(/@/);
      expect(sent.sentAt).not.toBeNull();
    }

    const mail = await packetMail(email);
    expect(mail).toBeDefined();
    expect(mail!.to_addresses).toEqual(expect.arrayContaining([email, 'neighbour@delivery.example']));
    expect(mail!.text).toContain('Thanks for having us!');
    expect(mail!.text).toContain(`https://loamline.example/portal/sites/${packet.siteId}`);
    expect(mail!.text).toContain('6 cable runs and 9 pieces of equipment');
    expect(mail!.text).toContain('2 points to note');
    expect(mail!.text).toContain('one-call locators do not mark these private cables');
    expect(mail!.html).toContain('Set your password');
    expect(mail!.attachments).toHaveLength(1);
    expect(mail!.attachments[0]!.content_type).toBe('application/pdf');
    expect(mail!.attachments[0]!.filename).toMatch(/\.pdf$/);
    expect(createHash('sha256').update(mail!.attachments[0]!.content).digest('hex')).toBe(packet.pdfSha256);

    // The linked homeowner's e-mail has no invitation.
    const linkedMail = await packetMail(company.users.homeowner.email);
    expect(linkedMail!.text).not.toContain('/accept-invitation');
    expect(linkedMail!.html).toContain('Open your property');

    // The invitation is in the packet e-mail itself: no separate invitation e-mail went out.
    await new Promise((resolve) => setTimeout(resolve, 1500));
    expect(await countMail(email)).toBe(invitationMailsBefore + 1);
    const token = new URL(findLink({ subject: mail!.subject, text: mail!.text, html: mail!.html }, '/accept-invitation')).searchParams.get('token')!;
    const accepted = await request(app.getHttpServer()).post('/api/auth/invitations/accept').send({ token, name: 'New Owner', password: 'a-long-enough-password' });
    expect(accepted.status, JSON.stringify(accepted.body)).toBe(200);
    const owner = apiAs(app, await signIn(app, { email }, 'a-long-enough-password'));
    const sites = await owner.expectOk('get', '/api/portal/sites');
    expect(sites.map((s: { id: string }) => s.id)).toEqual([packet.siteId]);

    // Sent again without `to`: to both, now linked homeowners, with no invitation.
    const again = await office.send('post', `/api/packets/${packet.id}/send`, {});
    expect(again.status).toBe(202);
    expect(again.body.deliveries).toEqual(
      expect.arrayContaining([expect.objectContaining({ to: email, isInvited: false }), expect.objectContaining({ to: company.users.homeowner.email, isInvited: false })]),
    );
    for (const d of again.body.deliveries) await waitForDelivery(office, packet.id, d.id, ['sent']);
    const log = await office.expectOk('get', `/api/packets/${packet.id}/deliveries`);
    expect(log.map((d: { status: string }) => d.status)).toEqual(['sent', 'sent', 'sent', 'sent']);

    // The job's log names the revision, job and site of each delivery.
    const jobLog = await office.expectOk('get', `/api/jobs/${packet.jobId}/deliveries`);
    expect(jobLog).toHaveLength(4);
    expect(jobLog[0]).toMatchObject({ revision: 1, jobId: packet.jobId, siteId: packet.siteId, siteLabel: expect.stringMatching(/^Fixture yard /) });
    for (const d of jobLog) DeliveryInContextSchema.parse(d);
  });

  it('should send the link only when the sender chooses so', async () => {
    const packet = await readyPacket(company, office);
    await office.expectOk('post', `/api/sites/${packet.siteId}/homeowners`, { userId: company.users.homeowner.id });
    const res = await office.send('post', `/api/packets/${packet.id}/send`, { pdf: 'link' });
    expect(res.status).toBe(202);
    expect(res.body.deliveries[0]).toMatchObject({ pdf: 'link' });
    const sent = await waitForDelivery(office, packet.id, res.body.deliveries[0].id, ['sent', 'failed']);
    expect(sent).toMatchObject({ status: 'sent', isPdfAttached: false });
    const mail = await packetMail(company.users.homeowner.email);
    expect(mail!.attachments).toEqual([]);
    expect(mail!.text).toContain('Download the packet');
    expect(mail!.text).not.toContain('too large');
  });

  it('should refuse the whole send when one address cannot be a homeowner, and writes nothing', async () => {
    const packet = await readyPacket(company, office);
    const fresh = `fresh.${randomUUID().slice(0, 8)}@delivery.example`;
    const res = await office.send('post', `/api/packets/${packet.id}/send`, { to: [fresh, company.users.tech.email] });
    expect(res.status).toBe(409);
    expect(res.body).toMatchObject({ code: 'RECIPIENT_NOT_HOMEOWNER', issues: [{ path: 'to.1' }] });
    await withDb(async (db) => {
      expect((await db.query('select 1 from packet_deliveries where revision_id = $1', [packet.id])).rowCount).toBe(0);
      expect((await db.query('select 1 from invitations where email = $1', [fresh])).rowCount).toBe(0);
    });
  });

  it('should let only admin and office send, send again and dismiss', async () => {
    const packet = await readyPacket(company, office);
    await office.expectOk('post', `/api/sites/${packet.siteId}/homeowners`, { userId: company.users.homeowner.id });
    const failedId = await withDb(async (db) => {
      const { rows } = await db.query(
        `insert into packet_deliveries (company_id, revision_id, to_address, status, attempts, last_error) values ($1, $2, $3, 'failed', 3, 'connect ECONNREFUSED 127.0.0.1:1') returning id`,
        [company.id, packet.id, company.users.homeowner.email],
      );
      return rows[0].id as string;
    });
    for (const role of ['lead', 'tech', 'homeowner'] as const) {
      const api = apiAs(app, await signIn(app, company.users[role]));
      expect((await api.send('post', `/api/packets/${packet.id}/send`, {})).status).toBe(403);
      expect((await api.send('post', `/api/deliveries/${failedId}/resend`)).status).toBe(403);
      expect((await api.send('post', `/api/deliveries/${failedId}/dismiss`)).status).toBe(403);
      expect((await api.send('get', '/api/deliveries/failed')).status).toBe(403);
    }
    const admin = apiAs(app, await signIn(app, company.users.admin));
    const failed = await admin.expectOk('get', '/api/deliveries/failed');
    expect(failed.find((d: { id: string }) => d.id === failedId)).toMatchObject({ status: 'failed', failureReason: 'The mail server could not be reached.' });
    // Dismissed: stays in the log, no longer asks for attention; dismissing twice changes nothing.
    const dismissed = await admin.expectOk('post', `/api/deliveries/${failedId}/dismiss`);
    expect(dismissed).toMatchObject({ status: 'failed', dismissedAt: expect.any(String) });
    expect(await admin.expectOk('post', `/api/deliveries/${failedId}/dismiss`)).toMatchObject({ dismissedAt: dismissed.dismissedAt });
    expect((await admin.expectOk('get', '/api/deliveries/failed')).map((d: { id: string }) => d.id)).not.toContain(failedId);
    expect((await admin.expectOk('get', `/api/packets/${packet.id}/deliveries`)).map((d: { id: string }) => d.id)).toContain(failedId);
    // A delivery that is not failed cannot be dismissed; one on its way cannot be sent again.
    const queued = await office.send('post', `/api/packets/${packet.id}/send`, {});
    const queuedId = queued.body.deliveries[0].id as string;
    const early = await office.send('post', `/api/deliveries/${queuedId}/resend`);
    if (early.status !== 202) expect(early.body.code).toBe('DELIVERY_IN_PROGRESS');
    await waitForDelivery(office, packet.id, queuedId, ['sent']);
    expect((await office.send('post', `/api/deliveries/${queuedId}/dismiss`)).body.code).toBe('DELIVERY_NOT_FAILED');
    // A sent delivery sent again is a new delivery to the same address; the first stays sent.
    const resent = await office.send('post', `/api/deliveries/${queuedId}/resend`);
    expect(resent.status).toBe(202);
    expect(resent.body).toMatchObject({ to: company.users.homeowner.email, status: 'queued' });
    expect(resent.body.id).not.toBe(queuedId);
    await waitForDelivery(office, packet.id, resent.body.id, ['sent']);
  });

  it('should refuse a revision that is not ready, bad bodies, and a staff address as homeowner', async () => {
    const packet = await readyPacket(company, office);
    await withDb((db) => db.query(`update packet_revisions set status = 'failed' where id = $1`, [packet.id]));
    expect((await office.send('post', `/api/packets/${packet.id}/send`, { to: 'x@delivery.example' })).body.code).toBe('PACKET_NOT_READY');
    const ready = await readyPacket(company, office);
    expect((await office.send('post', `/api/packets/${ready.id}/send`, { to: 'x@delivery.example', cc: Array.from({ length: 6 }, (_, i) => `cc${i}@delivery.example`) })).status).toBe(400);
    expect((await office.send('post', `/api/packets/${ready.id}/send`, { to: 'x@delivery.example', message: 'x'.repeat(1001) })).status).toBe(400);
    const staff = await office.send('post', `/api/packets/${ready.id}/send`, { to: company.users.tech.email });
    expect(staff.status).toBe(409);
    expect(staff.body.code).toBe('RECIPIENT_NOT_HOMEOWNER');
  });
});

describe('sending a PDF over MAIL_MAX_ATTACHMENT_BYTES', () => {
  let app: NestExpressApplication;

  afterAll(async () => {
    await app?.close();
  });

  it('should send the portal link only', async () => {
    app = await startApp({ SMTP_URL: undefined, MAIL_MAX_ATTACHMENT_BYTES: '1000' });
    const company = await createCompany('Delivery Large');
    const office = apiAs(app, await signIn(app, company.users.office));
    const packet = await readyPacket(company, office, 5_000);
    await office.expectOk('post', `/api/sites/${packet.siteId}/homeowners`, { userId: company.users.homeowner.id });
    const res = await office.send('post', `/api/packets/${packet.id}/send`, {});
    expect(res.status).toBe(202);
    const sent = await waitForDelivery(office, packet.id, res.body.deliveries[0].id, ['sent', 'failed']);
    expect(sent).toMatchObject({ status: 'sent', isPdfAttached: false });
    const mail = await packetMail(company.users.homeowner.email);
    expect(mail!.attachments).toEqual([]);
    expect(mail!.text).toContain('too large to attach');
    expect(mail!.text).toContain(`https://loamline.example/portal/sites/${packet.siteId}`);
  });
});

describe('sending while the SMTP server is unreachable', () => {
  let app: NestExpressApplication;
  let smtp: SMTPServer | undefined;

  afterAll(async () => {
    await app?.close();
    await new Promise<void>((resolve) => (smtp ? smtp.close(() => resolve()) : resolve()));
  });

  it('should answer 202, retry, log the delivery as failed with a plain reason, and send it when sent again', async () => {
    const port = await closedPort();
    app = await startApp({ SMTP_URL: `smtp://127.0.0.1:${port}`, MAIL_MAX_ATTACHMENT_BYTES: undefined });
    const company = await createCompany('Delivery Down');
    const office = apiAs(app, await signIn(app, company.users.office));
    const packet = await readyPacket(company, office);
    await office.expectOk('post', `/api/sites/${packet.siteId}/homeowners`, { userId: company.users.homeowner.id });
    const res = await office.send('post', `/api/packets/${packet.id}/send`, {});
    expect(res.status).toBe(202);
    const failed = await waitForDelivery(office, packet.id, res.body.deliveries[0].id, ['failed'], 45_000);
    // PACKET_SEND_RETRIES=2: the first attempt and two retries.
    expect(failed).toMatchObject({ status: 'failed', attempts: 3, isPdfAttached: null, sentAt: null, failureReason: 'The mail server could not be reached.' });
    expect(failed.lastError).toMatch(/ECONNREFUSED|connect/i);
    // It waits for the office on the company's list of failures.
    const open = await office.expectOk('get', '/api/deliveries/failed');
    expect(open).toEqual([expect.objectContaining({ id: failed.id, jobId: packet.jobId, revision: 1, failureReason: 'The mail server could not be reached.' })]);

    // The mail server comes back; Send again goes through and the failure leaves the list.
    const received: { to: string[]; raw: string }[] = [];
    smtp = new SMTPServer({
      authOptional: true,
      disabledCommands: ['STARTTLS', 'AUTH'],
      logger: false,
      onData(stream, session, callback) {
        const chunks: Buffer[] = [];
        stream.on('data', (c: Buffer) => chunks.push(c));
        stream.on('end', () => {
          received.push({ to: session.envelope.rcptTo.map((r) => r.address), raw: Buffer.concat(chunks).toString() });
          callback();
        });
      },
    });
    await new Promise<void>((resolve) => smtp!.listen(port, '127.0.0.1', () => resolve()));
    const again = await office.send('post', `/api/deliveries/${failed.id}/resend`);
    expect(again.status, JSON.stringify(again.body)).toBe(202);
    expect(again.body).toMatchObject({ id: failed.id, status: 'queued' });
    const sent = await waitForDelivery(office, packet.id, failed.id, ['sent', 'failed'], 30_000);
    expect(sent).toMatchObject({ status: 'sent', lastError: null, failureReason: null });
    expect(sent.sentAt).not.toBeNull();
    expect(await office.expectOk('get', '/api/deliveries/failed')).toEqual([]);
    expect(received.filter((m) => m.to.includes(company.users.homeowner.email) && /Subject: Your handover packet/.test(m.raw))).toHaveLength(1);
  }, 90_000);
});
