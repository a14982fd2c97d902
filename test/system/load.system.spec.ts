import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';

import { DEMO_EMAILS, DEMO_PASSWORD } from '../../api/src/db/seed/demo-records.js';
// @ts-expect-error -- plain ESM script shared with `npm start`; no type declarations.
import { seedDemo } from '../../scripts/lib/seed.mjs';
import { formatLoad, type LoadFigures, type LoadTarget, runLoad } from './support/load.js';
import { type RunningApi, signInOverHttp, startApi } from './support/processes.js';

const UPLOADS_DIR = mkdtempSync(join(tmpdir(), 'loamline-load-'));
const CONNECTIONS = 50;

// A bounded load test on loopback: a fixed number of requests per endpoint at 50 concurrent
// connections, each run capped in time. It asserts correctness under concurrency (every answer 2xx, no
// socket errors); the latency figures are printed for the record, and `npm run bench` tracks them.
describe(`the built API under ${CONNECTIONS} concurrent connections`, () => {
  let api: RunningApi | undefined;
  let token: string;
  let jobId: string;

  beforeAll(async () => {
    await seedDemo(inject('databaseUrl'));
    api = await startApi(inject('databaseUrl'), {
      PACKET_WORKER_IN_API: 'false',
      UPLOADS_DIR,
      // Every sign-in here comes from one address for one account: lift the throttle for this run.
      SIGN_IN_LIMIT_PER_ADDRESS_PER_MINUTE: '100000',
      SIGN_IN_LIMIT_PER_ACCOUNT: '100000',
      SIGN_IN_LIMIT_PER_ACCOUNT_GLOBAL: '100000',
    });
    token = await signInOverHttp(api.baseUrl, DEMO_EMAILS.office, DEMO_PASSWORD);
    const list = await fetch(`${api.baseUrl}/api/jobs?pageSize=100`, { headers: { Authorization: `Bearer ${token}` } });
    const { items } = (await list.json()) as { items: { id: string; title: string }[] };
    // The seeded jobs carry whole as-builts; any of them exercises the full read and analysis.
    jobId = items[0]!.id;
  });

  afterAll(async () => {
    await api?.process.stop();
    rmSync(UPLOADS_DIR, { recursive: true, force: true });
  });

  function expectClean(figures: LoadFigures, amount: number): void {
    console.log(formatLoad(figures));
    expect(figures.isCapped, `${figures.name} did not finish ${amount} requests in time`).toBe(false);
    expect(figures).toMatchObject({ requests: amount, ok2xx: amount, non2xx: 0, errors: 0, timeouts: 0 });
    expect(figures.p99Ms).toBeGreaterThan(0);
  }

  it('should sign in 100 times with no error', async () => {
    const target: LoadTarget = {
      name: 'POST /api/auth/sign-in',
      url: `${api!.baseUrl}/api/auth/sign-in`,
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ email: DEMO_EMAILS.office, password: DEMO_PASSWORD }),
    };
    expectClean(await runLoad(target, { connections: CONNECTIONS, amount: 100, seconds: 45 }), 100);
  });

  it('should list jobs 500 times with no error', async () => {
    const target: LoadTarget = { name: 'GET /api/jobs', url: `${api!.baseUrl}/api/jobs`, headers: { authorization: `Bearer ${token}` } };
    expectClean(await runLoad(target, { connections: CONNECTIONS, amount: 500, seconds: 45 }), 500);
  });

  it('should read a whole as-built 300 times with no error', async () => {
    const target: LoadTarget = {
      name: 'GET /api/jobs/:id/as-built',
      url: `${api!.baseUrl}/api/jobs/${jobId}/as-built`,
      headers: { authorization: `Bearer ${token}` },
    };
    expectClean(await runLoad(target, { connections: CONNECTIONS, amount: 300, seconds: 45 }), 300);
  });
});
