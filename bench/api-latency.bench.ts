/**
 * API latency benchmark: `npx tsx bench/api-latency.bench.ts` (part of `npm run bench`).
 *
 * Self-contained: creates a throwaway database (`loamline_bench_api`) with the demo seed, builds the API
 * if needed and starts the built server (`api/dist/main.js`, NODE_ENV=production) on a free loopback
 * port. autocannon then keeps 50 connections busy for a few seconds on each endpoint: `/api/health`
 * (the baseline: routing, guards, helmet and one `select 1`), the jobs list, and the whole as-built of
 * the demo job (record, analysis, mapping). Sign-in is measured on a fixed count (Argon2id by design
 * costs tens of ms of CPU each). Figures: p50 and p99 latency, throughput, and each endpoint's p50/p99
 * as a ratio to /api/health, so machines of different speed compare.
 */
import { randomBytes } from 'node:crypto';
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

import { DEMO_EMAILS, DEMO_PASSWORD } from '../api/src/db/seed/demo-records.js';
// @ts-expect-error -- plain ESM script shared with `npm start`; no type declarations.
import { seedDemo } from '../scripts/lib/seed.mjs';
// @ts-expect-error -- plain ESM script shared with `npm start`; no type declarations.
import { ensureApiBuilt, ensureDatabase, ensurePostgres, migrate, stopPostgres } from '../scripts/lib/setup.mjs';
import { formatLoad, type LoadFigures, runLoad } from '../test/system/support/load.js';
import { signInOverHttp, startApi } from '../test/system/support/processes.js';
import { type BenchFigure, recordResults } from './results.js';

const CONNECTIONS = 50;
const SECONDS = 5;
const SIGN_INS = 100;

async function main(): Promise<void> {
  const pgServer = ensurePostgres();
  const databaseUrl: string = await ensureDatabase(pgServer, 'loamline_bench_api', { fresh: true });
  const uploads = await mkdtemp(join(tmpdir(), 'loamline-bench-api-'));
  let api: Awaited<ReturnType<typeof startApi>> | undefined;
  try {
    await migrate(databaseUrl);
    ensureApiBuilt();
    await seedDemo(databaseUrl);
    api = await startApi(databaseUrl, {
      NODE_ENV: 'production',
      LOG_FORMAT: 'json',
      JWT_ACCESS_SECRET: randomBytes(32).toString('hex'),
      PACKET_WORKER_IN_API: 'false',
      UPLOADS_DIR: uploads,
      // All sign-ins come from one address for one account: lift the throttle for the measurement.
      SIGN_IN_LIMIT_PER_ADDRESS_PER_MINUTE: '100000',
      SIGN_IN_LIMIT_PER_ACCOUNT: '100000',
      SIGN_IN_LIMIT_PER_ACCOUNT_GLOBAL: '100000',
    });
    const base = api.baseUrl;
    const token = await signInOverHttp(base, DEMO_EMAILS.office, DEMO_PASSWORD);
    const auth = { authorization: `Bearer ${token}` };
    const list = (await (await fetch(`${base}/api/jobs?pageSize=100`, { headers: auth })).json()) as { items: { id: string }[] };
    const jobId = list.items[0]!.id;

    console.log(`Loamline API latency benchmark — node ${process.version}, ${CONNECTIONS} connections, ${SECONDS} s per endpoint on loopback`);
    const runs: LoadFigures[] = [];
    for (const [name, url] of [
      ['GET /api/health', `${base}/api/health`],
      ['GET /api/jobs', `${base}/api/jobs`],
      ['GET /api/jobs/:id/as-built', `${base}/api/jobs/${jobId}/as-built`],
    ] as const) {
      // A short warm-up (JIT, pool connections), not measured.
      await runLoad({ name, url, headers: auth }, { connections: 10, seconds: 1 });
      runs.push(await runLoad({ name, url, headers: auth }, { connections: CONNECTIONS, seconds: SECONDS }));
    }
    runs.push(
      await runLoad(
        {
          name: `POST /api/auth/sign-in ×${SIGN_INS}`,
          url: `${base}/api/auth/sign-in`,
          method: 'POST',
          headers: { 'content-type': 'application/json' },
          body: JSON.stringify({ email: DEMO_EMAILS.office, password: DEMO_PASSWORD }),
        },
        { connections: CONNECTIONS, amount: SIGN_INS, seconds: 60 },
      ),
    );

    const health = runs[0]!;
    console.log('');
    for (const run of runs) {
      console.log(`${formatLoad(run)}   × health p50 ${(run.p50Ms / Math.max(health.p50Ms, 0.5)).toFixed(1)}  p99 ${(run.p99Ms / Math.max(health.p99Ms, 0.5)).toFixed(1)}`);
    }
    const failures = runs.filter((r) => r.non2xx > 0 || r.errors > 0 || r.timeouts > 0);
    if (failures.length > 0) console.log(`WARNING: non-2xx or errors on ${failures.map((r) => r.name).join(', ')}`);

    const figures: BenchFigure[] = [];
    for (const run of runs) {
      figures.push(
        { label: `${run.name}, p50`, value: run.p50Ms, unit: 'ms' },
        { label: `${run.name}, p99`, value: run.p99Ms, unit: 'ms', goal: 'no errors', isMet: run.non2xx === 0 && run.errors === 0 && run.timeouts === 0 },
        { label: `${run.name}, throughput`, value: run.requestsPerSecond, unit: 'req/s' },
      );
      if (run !== health) {
        figures.push(
          { label: `${run.name}, p50 / health p50`, value: run.p50Ms / Math.max(health.p50Ms, 0.5), unit: '×' },
          { label: `${run.name}, p99 / health p99`, value: run.p99Ms / Math.max(health.p99Ms, 0.5), unit: '×' },
        );
      }
    }
    recordResults('api-latency', figures);
  } finally {
    await api?.process.stop();
    await rm(uploads, { recursive: true, force: true });
    stopPostgres(pgServer);
  }
}

main().catch((error: unknown) => {
  console.error(error);
  process.exit(1);
});
