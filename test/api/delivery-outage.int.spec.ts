import { randomBytes, randomUUID } from 'node:crypto';
import { mkdtempSync, rmSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

import type { NestExpressApplication } from '@nestjs/platform-express';
import { SMTPServer } from 'smtp-server';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { DEMO_AS_BUILT } from '../../api/src/domain/as-built/demo-as-built.js';
import { PacketDeliveryResponseSchema, type PacketDeliveryResponse } from '../../api/src/domain/delivery/delivery.schema.js';
import { DiskStorage } from '../../api/src/storage/disk-storage.js';
import { createCompany, type TestCompany, withDb } from '../support/fixtures.js';
import { type Api, apiAs, createSite, insertRecordedJob } from '../support/records.js';
import { signIn } from '../support/session.js';

const UPLOADS_DIR = mkdtempSync(join(tmpdir(), 'loamline-delivery-outage-'));

/** A port nothing listens on yet (taken from the OS, then released); the SMTP server comes up there later. */
async function freePort(): Promise<number> {
  const server = createServer();
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const { port } = server.address() as { port: number };
  await new Promise<void>((resolve) => server.close(() => resolve()));
  return port;
}

/** A ready revision whose (stand-in) PDF and archive are stored where the app reads them. */
async function readyPacket(company: TestCompany, office: Api) {
  const { siteId } = await createSite(office, DEMO_AS_BUILT.site);
  const job = await insertRecordedJob(company, siteId, { crewLeadUserId: company.users.lead.id, technicianUserIds: [] }, DEMO_AS_BUILT);
  const storage = new DiskStorage(UPLOADS_DIR);
  const id = randomUUID();
  const pdf = await storage.put(`companies/${company.id}/packets/${id}/packet-rev-1.pdf`, Buffer.concat([Buffer.from('%PDF-1.7\n'), randomBytes(2000)]), 'application/pdf');
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
  return { id, siteId };
}

describe('an SMTP outage, then the server comes back', () => {
  let app: NestExpressApplication;
  let smtp: SMTPServer | undefined;
  let port: number;
  const received: { to: string[]; raw: string }[] = [];

  beforeAll(async () => {
    port = await freePort();
    Object.assign(process.env, {
      PACKET_WORKER_IN_API: 'false',
      QUEUE_POLL_INTERVAL_SECONDS: '0.5',
      UPLOADS_DIR,
      APP_URL: 'https://loamline.example',
      SMTP_URL: `smtp://127.0.0.1:${port}`,
      PACKET_SEND_RETRIES: '8',
      PACKET_SEND_RETRY_DELAY_SECONDS: '1',
    });
    const { createTestApp } = await import('../support/test-app.js');
    app = await createTestApp();
  });

  afterAll(async () => {
    await app?.close();
    await new Promise<void>((resolve) => (smtp ? smtp.close(() => resolve()) : resolve()));
    rmSync(UPLOADS_DIR, { recursive: true, force: true });
  });

  async function delivery(api: Api, revisionId: string, deliveryId: string): Promise<PacketDeliveryResponse | undefined> {
    const list = await api.expectOk('get', `/api/packets/${revisionId}/deliveries`);
    const found = list.find((d: { id: string }) => d.id === deliveryId);
    return found ? PacketDeliveryResponseSchema.parse(found) : undefined;
  }

  async function waitFor(api: Api, revisionId: string, deliveryId: string, done: (d: PacketDeliveryResponse) => boolean, what: string) {
    const deadline = Date.now() + 45_000;
    for (;;) {
      const d = await delivery(api, revisionId, deliveryId);
      if (d && done(d)) return d;
      if (Date.now() > deadline) throw new Error(`${what}: delivery is ${JSON.stringify(d)}`);
      await new Promise((resolve) => setTimeout(resolve, 200));
    }
  }

  it('should keep the mail queued through the outage and deliver it exactly once when SMTP returns', async () => {
    const company = await createCompany('Delivery Outage');
    const office = apiAs(app, await signIn(app, company.users.office));
    const packet = await readyPacket(company, office);
    await office.expectOk('post', `/api/sites/${packet.siteId}/homeowners`, { userId: company.users.homeowner.id });

    const res = await office.send('post', `/api/packets/${packet.id}/send`, {});
    expect(res.status).toBe(202);
    const deliveryId: string = res.body.deliveries[0].id;

    // The outage: the first attempt fails and the delivery waits for its retry, not failed, not lost.
    const waiting = await waitFor(office, packet.id, deliveryId, (d) => d.attempts >= 1 && d.lastError !== null, 'a failed first attempt');
    expect(waiting).toMatchObject({ status: 'queued', sentAt: null });
    expect(waiting.lastError).toMatch(/ECONNREFUSED|connect/i);

    // The SMTP server comes back on the same address.
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

    const sent = await waitFor(office, packet.id, deliveryId, (d) => d.status !== 'queued' && d.status !== 'sending', 'delivery after recovery');
    expect(sent).toMatchObject({ status: 'sent', lastError: null });
    expect(sent.attempts).toBeGreaterThanOrEqual(2);

    // Give a duplicate (a second worker, a replayed queue message) time to show up; there must be none.
    await new Promise((resolve) => setTimeout(resolve, 3000));
    const toHomeowner = received.filter((m) => m.to.includes(company.users.homeowner.email) && /Subject: Your handover packet/.test(m.raw));
    expect(toHomeowner).toHaveLength(1);
  }, 90_000);
});
