import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

import type { NestExpressApplication } from '@nestjs/platform-express';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { DEMO_AS_BUILT } from '../../api/src/domain/as-built/demo-as-built.js';
import { pdfPages } from '../print/packet-pdf.js';
import { createCompany, type TestCompany, withDb } from '../support/fixtures.js';
import { type Api, apiAs, createJob, createSite, type JobFixture, moveJob, recordAsBuilt } from '../support/records.js';
import { bearer, signIn } from '../support/session.js';

// ConfigModule reads the environment when AppModule is imported: set this file's settings first.
Object.assign(process.env, {
  PACKET_WORKER_IN_API: 'true',
  QUEUE_POLL_INTERVAL_SECONDS: '0.5',
  UPLOADS_DIR: mkdtempSync(join(tmpdir(), 'loamline-signatures-uploads-')),
});

const LEAD_SIGNER = 'Torvald Signwell';
const HOMEOWNER_SIGNER = 'Henrietta Quillfeather';
const PATH = 'M 12 80 C 40 20 60 20 80 70 L 140 40 Q 200 10 260 60 L 380 50';

describe('walkthrough signatures (captured before issue, printed in the packet)', () => {
  let app: NestExpressApplication;
  let company: TestCompany;
  let office: Api;
  let lead: Api;
  let tech: Api;
  let job: JobFixture;

  beforeAll(async () => {
    const { createTestApp } = await import('../support/test-app.js');
    app = await createTestApp();
    company = await createCompany('Signature Render');
    office = apiAs(app, await signIn(app, company.users.office));
    lead = apiAs(app, await signIn(app, company.users.lead));
    tech = apiAs(app, await signIn(app, company.users.tech));
    const { siteId } = await createSite(office, DEMO_AS_BUILT.site);
    const created = await createJob(office, siteId, { crewLeadUserId: company.users.lead.id, technicianUserIds: [company.users.tech.id] });
    const recorded = await recordAsBuilt(lead, created, DEMO_AS_BUILT);
    const submitted = await moveJob(lead, { ...created, version: recorded.version }, 'in_progress', 'submitted');
    job = await moveJob(office, submitted, 'ready_to_issue');
  }, 120_000);

  afterAll(async () => {
    await app?.close();
  });

  it('should refuse a technician, markup in the path, and a stale version', async () => {
    const byTech = await tech.send('put', `/api/jobs/${job.id}/signatures/lead`, { signerName: 'T', svgPath: PATH }, { 'If-Match': `"${job.version}"` });
    expect(byTech.status).toBe(403);
    const markup = await lead.send(
      'put',
      `/api/jobs/${job.id}/signatures/homeowner`,
      { signerName: 'X', svgPath: 'M 1 1"/><script>alert(1)</script>' },
      { 'If-Match': `"${job.version}"` },
    );
    expect(markup.status).toBe(400);
    const badRole = await lead.send('put', `/api/jobs/${job.id}/signatures/inspector`, { signerName: 'X', svgPath: PATH }, { 'If-Match': `"${job.version}"` });
    expect(badRole.status).toBe(400);
    const stale = await lead.send('put', `/api/jobs/${job.id}/signatures/lead`, { signerName: 'X', svgPath: PATH }, { 'If-Match': `"${job.version - 1}"` });
    expect(stale.status).toBe(412);
    expect(stale.body.code).toBe('VERSION_CONFLICT');
  });

  it('should save, replace and clear signatures on a ready-to-issue job (the crew lead at the walkthrough)', async () => {
    let version = job.version;
    const first = await lead.expectOk('put', `/api/jobs/${job.id}/signatures/homeowner`, { signerName: 'Someone Else', svgPath: PATH }, { 'If-Match': `"${version}"` });
    version = first.jobVersion;
    const cleared = await lead.expectOk('delete', `/api/jobs/${job.id}/signatures/homeowner`, undefined, { 'If-Match': `"${version}"` });
    version = cleared.jobVersion;
    const missing = await lead.send('delete', `/api/jobs/${job.id}/signatures/homeowner`, undefined, { 'If-Match': `"${version}"` });
    expect(missing.status).toBe(404);
    const home = await lead.expectOk('put', `/api/jobs/${job.id}/signatures/homeowner`, { signerName: HOMEOWNER_SIGNER, svgPath: PATH }, { 'If-Match': `"${version}"` });
    const signedAt = '2026-05-20T17:00:00.000Z';
    const own = await lead.expectOk('put', `/api/jobs/${job.id}/signatures/lead`, { signerName: LEAD_SIGNER, svgPath: PATH, signedAt }, { 'If-Match': `"${home.jobVersion}"` });
    expect(own.signature).toMatchObject({ role: 'lead', signerName: LEAD_SIGNER, signedAt, svgPath: PATH, capturedByUserId: company.users.lead.id });
    job = { ...job, version: own.jobVersion };
    const list = await tech.expectOk('get', `/api/jobs/${job.id}/signatures`);
    expect(list.map((s: { role: string; signerName: string }) => [s.role, s.signerName])).toEqual([
      ['lead', LEAD_SIGNER],
      ['homeowner', HOMEOWNER_SIGNER],
    ]);
  });

  it('should print the signers in the issued packet instead of "Not signed", and move the signatures to the revision', async () => {
    const issued = await office.send('post', `/api/jobs/${job.id}/packets`, undefined, { 'If-Match': `"${job.version}"` });
    expect(issued.status, JSON.stringify(issued.body)).toBe(201);
    const deadline = Date.now() + 90_000;
    let status = issued.body.status as string;
    while (status !== 'ready' && status !== 'failed' && Date.now() < deadline) {
      await new Promise((resolve) => setTimeout(resolve, 300));
      status = (await office.expectOk('get', `/api/packets/${issued.body.id}`)).status;
    }
    expect(status).toBe('ready');
    const download = await request(app.getHttpServer())
      .get(`/api/packets/${issued.body.id}/pdf`)
      .set(bearer(await signIn(app, company.users.office)))
      .buffer(true)
      .parse((response, callback) => {
        const chunks: Buffer[] = [];
        response.on('data', (c: Buffer) => chunks.push(c));
        response.on('end', () => callback(null, Buffer.concat(chunks)));
      });
    expect(download.status).toBe(200);
    const text = (await pdfPages(download.body as Buffer)).join(' ');
    expect(text).toContain(LEAD_SIGNER);
    expect(text).toContain(HOMEOWNER_SIGNER);
    expect(text).not.toContain('Not signed');

    expect(await lead.expectOk('get', `/api/jobs/${job.id}/signatures`)).toEqual([]);
    const copied = await withDb((db) => db.query('select role, signer_name from packet_signatures where revision_id = $1 order by role', [issued.body.id]));
    expect(copied.rows).toEqual([
      { role: 'lead', signer_name: LEAD_SIGNER },
      { role: 'homeowner', signer_name: HOMEOWNER_SIGNER },
    ]);
    // An issued job takes no signatures until it is reopened.
    const late = await lead.send('put', `/api/jobs/${job.id}/signatures/lead`, { signerName: LEAD_SIGNER, svgPath: PATH }, { 'If-Match': `"${issued.body.jobVersion}"` });
    expect(late.status).toBe(409);
  }, 150_000);
});
