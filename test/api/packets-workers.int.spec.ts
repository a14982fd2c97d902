import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

import type { INestApplicationContext } from '@nestjs/common';
import type { NestExpressApplication } from '@nestjs/platform-express';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { DEMO_AS_BUILT } from '../../api/src/domain/as-built/demo-as-built.js';
import { createCompany, type TestCompany, withDb } from '../support/fixtures.js';
import { type Api, apiAs, createSite, insertRecordedJob } from '../support/records.js';
import { signIn } from '../support/session.js';

// The API here only issues; two separate worker contexts (each with its own pg-boss and Chromium)
// share the queue, as two `npm run worker` processes would.
Object.assign(process.env, {
  PACKET_WORKER_IN_API: 'false',
  QUEUE_POLL_INTERVAL_SECONDS: '0.5',
  PACKET_RENDER_CONCURRENCY: '2',
  UPLOADS_DIR: mkdtempSync(join(tmpdir(), 'loamline-packet-workers-')),
});

describe('two packet workers on one queue', () => {
  let app: NestExpressApplication;
  let workers: INestApplicationContext[] = [];
  let company: TestCompany;
  let office: Api;

  beforeAll(async () => {
    const { createTestApp } = await import('../support/test-app.js');
    const { NestFactory } = await import('@nestjs/core');
    const { PacketWorkerModule } = await import('../../api/src/packets/packet-worker.module.js');
    app = await createTestApp();
    workers = await Promise.all([0, 1].map(() => NestFactory.createApplicationContext(PacketWorkerModule, { logger: ['error'] })));
    company = await createCompany('Packet Workers');
    office = apiAs(app, await signIn(app, company.users.office));
  }, 60_000);

  afterAll(async () => {
    for (const worker of workers) await worker.close();
    await app?.close();
  });

  it('should render 4 packets, none of them twice', async () => {
    const { siteId } = await createSite(office, DEMO_AS_BUILT.site);
    const jobs = [];
    // Four revisions over two workers at concurrency 2: every worker slot claims one if claims can race.
    for (let i = 0; i < 4; i += 1) {
      const job = await insertRecordedJob(company, siteId, { crewLeadUserId: company.users.lead.id, technicianUserIds: [] }, DEMO_AS_BUILT);
      await withDb((db) => db.query(`update jobs set status = 'ready_to_issue' where id = $1`, [job.id]));
      jobs.push(job);
    }
    const issued = await Promise.all(jobs.map((job) => office.expectOk('post', `/api/jobs/${job.id}/packets`, undefined, { 'If-Match': '1' })));
    const ids = issued.map((p: { id: string }) => p.id);
    const deadline = Date.now() + 240_000;
    let rows: { id: string; status: string; attempts: number }[] = [];
    for (;;) {
      rows = (await withDb((db) => db.query('select id, status, attempts from packet_revisions where id = any($1)', [ids]))).rows;
      if (rows.every((r) => r.status === 'ready' || r.status === 'failed') || Date.now() > deadline) break;
      await new Promise((resolve) => setTimeout(resolve, 500));
    }
    expect(rows).toHaveLength(4);
    for (const row of rows) expect(row, row.id).toMatchObject({ status: 'ready', attempts: 1 });
    // Every queue message completed, and each revision was claimed exactly once (attempts = 1).
    const completed = await withDb((db) =>
      db.query(`select count(*)::int as n from pgboss.job where name = 'packet-render' and data->>'revisionId' = any($1) and state = 'completed'`, [ids]),
    );
    expect(completed.rows[0].n).toBe(4);
  }, 300_000);
});
