import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

import pg from 'pg';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

// @ts-expect-error -- plain ESM script shared with `npm start`; no type declarations.
import { seedDemo } from '../../scripts/lib/seed.mjs';
// @ts-expect-error -- plain ESM script shared with `npm start`; no type declarations.
import { migrate } from '../../scripts/lib/setup.mjs';
import { DEMO_EMAILS, DEMO_PASSWORD } from '../../api/src/db/seed/demo-records.js';
import { DEMO_JOB_TITLES } from '../../api/src/db/seed/demo-seed.js';
import { type RunningApi, signInOverHttp, sleep, startApi } from './support/processes.js';
import { ScratchCluster } from './support/scratch-cluster.js';

// The demo seed's office user.
const OFFICE = { email: DEMO_EMAILS.office, password: DEMO_PASSWORD };
const UPLOADS_DIR = mkdtempSync(join(tmpdir(), 'loamline-db-outage-'));

describe('PostgreSQL stopped under a running API', () => {
  let cluster: ScratchCluster | undefined;
  let api: RunningApi | undefined;
  let token: string;
  let jobId: string;

  beforeAll(async () => {
    cluster = await ScratchCluster.create();
    const admin = new pg.Client({ connectionString: cluster.url() });
    await admin.connect();
    await admin.query('create database loamline');
    await admin.end();
    const databaseUrl = cluster.url('loamline');
    await migrate(databaseUrl);
    await seedDemo(databaseUrl);
    // The API renders packets itself here (its in-process worker), to show the queue recovers too.
    api = await startApi(databaseUrl, { UPLOADS_DIR, QUEUE_POLL_INTERVAL_SECONDS: '0.5' });
    token = await signInOverHttp(api.baseUrl, OFFICE.email, OFFICE.password);
  });

  afterAll(async () => {
    await api?.process.stop();
    cluster?.destroy();
    rmSync(UPLOADS_DIR, { recursive: true, force: true });
  });

  const get = (path: string) => fetch(`${api!.baseUrl}${path}`, { headers: { Authorization: `Bearer ${token}` } });
  const post = (path: string, body: object | undefined, headers: Record<string, string> = {}) =>
    fetch(`${api!.baseUrl}${path}`, {
      method: 'POST',
      headers: { Authorization: `Bearer ${token}`, ...(body ? { 'Content-Type': 'application/json' } : {}), ...headers },
      body: body ? JSON.stringify(body) : undefined,
    });

  /** The API's one error body for "database unreachable": 503, no stack, no driver detail. */
  async function expectUnavailable(res: Response, what: string): Promise<void> {
    const text = await res.text();
    expect(res.status, `${what}: ${text}\n${api!.process.tail(15)}`).toBe(503);
    const body = JSON.parse(text) as Record<string, unknown>;
    expect(body).toEqual({
      statusCode: 503,
      error: 'Service Unavailable',
      message: expect.any(String),
      code: 'DATABASE_UNAVAILABLE',
    });
    expect(text).not.toMatch(/ECONNREFUSED|\bat .+\(|node_modules|\.js:\d+/);
  }

  it('should answer 503 while the database is down, and recover when it returns without a restart', async () => {
    const jobs = await get('/api/jobs');
    expect(jobs.status).toBe(200);
    const list = (await jobs.json()) as { items: { id: string; title: string }[] };
    // The demo job that is submitted with a whole as-built: ready to be issued once the office agrees.
    jobId = list.items.find((j) => j.title === DEMO_JOB_TITLES.recorded)!.id;
    expect((await get(`/api/jobs/${jobId}/as-built`)).status).toBe(200);

    cluster!.stop();

    const started = Date.now();
    const health = await fetch(`${api!.baseUrl}/api/health`);
    expect(health.status).toBe(503);
    expect(await health.json()).toMatchObject({ status: 'error', database: { status: 'down', error: 'database unreachable' } });
    await expectUnavailable(await get('/api/jobs'), 'jobs list');
    await expectUnavailable(await get(`/api/jobs/${jobId}/as-built`), 'as-built');
    await expectUnavailable(
      await fetch(`${api!.baseUrl}/api/auth/sign-in`, {
        method: 'POST',
        headers: { 'Content-Type': 'application/json' },
        body: JSON.stringify(OFFICE),
      }),
      'sign-in',
    );
    await expectUnavailable(
      await fetch(`${api!.baseUrl}/api/jobs/${jobId}`, {
        method: 'PATCH',
        headers: { Authorization: `Bearer ${token}`, 'Content-Type': 'application/json', 'If-Match': '"1"' },
        body: JSON.stringify({ notes: 'written while the database was down' }),
      }),
      'a job write',
    );
    // Failing fast (the pool's connection timeout), not hanging until the client gives up.
    expect(Date.now() - started).toBeLessThan(30_000);
    expect(api!.process.isRunning).toBe(true);

    cluster!.start();

    const deadline = Date.now() + 30_000;
    while ((await fetch(`${api!.baseUrl}/api/health`)).status !== 200) {
      if (Date.now() > deadline) throw new Error(`the API did not recover within 30 s:\n${api!.process.tail()}`);
      await sleep(250);
    }
    // The same session, the same process: reads, a new sign-in and the as-built all work again.
    expect((await get('/api/jobs')).status).toBe(200);
    expect((await get(`/api/jobs/${jobId}/as-built`)).status).toBe(200);
    await expect(signInOverHttp(api!.baseUrl, OFFICE.email, OFFICE.password)).resolves.toEqual(expect.any(String));

    // Writes and the packet queue work again: issue the job's packet and let the API's worker render it.
    const job = (await (await get(`/api/jobs/${jobId}`)).json()) as { version: number };
    const moved = await post(`/api/jobs/${jobId}/status`, { to: 'ready_to_issue', expectedVersion: job.version });
    expect(moved.status, await moved.clone().text()).toBe(200);
    const { version } = (await moved.json()) as { version: number };
    const issued = await post(`/api/jobs/${jobId}/packets`, undefined, { 'If-Match': `"${version}"` });
    expect(issued.status, await issued.clone().text()).toBe(201);
    const { id: revisionId } = (await issued.json()) as { id: string };
    const client = new pg.Client({ connectionString: cluster!.url('loamline') });
    await client.connect();
    try {
      const renderDeadline = Date.now() + 90_000;
      for (;;) {
        const { rows } = await client.query<{ status: string }>('select status from packet_revisions where id = $1', [revisionId]);
        if (rows[0]!.status === 'ready') break;
        expect(rows[0]!.status).not.toBe('failed');
        if (Date.now() > renderDeadline) throw new Error(`the packet is still ${rows[0]!.status}:\n${api!.process.tail()}`);
        await sleep(300);
      }
    } finally {
      await client.end();
    }
    expect(api!.process.isRunning).toBe(true);
  });
});
