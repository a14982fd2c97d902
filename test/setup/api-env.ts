import { randomBytes } from 'node:crypto';

import { inject } from 'vitest';

/**
 * This worker's own database (test/setup/database.global.ts makes one copy per worker): files of the
 * integration project run side by side, one per worker, and must not see each other's rows.
 */
function workerDatabaseUrl(): string {
  const urls = inject('workerDatabaseUrls');
  const poolId = Number(process.env.VITEST_POOL_ID ?? '1');
  const url = urls[poolId - 1];
  if (!url) throw new Error(`no test database for worker ${poolId} (${urls.length} made): set maxWorkers on the project, not only on the command line`);
  return url;
}

const databaseUrl = workerDatabaseUrl();
// `inject('databaseUrl')` (fixtures, seeds, direct clients in tests) must name the same database as the
// app under test. Vitest keeps the provided values of the running file in its worker state; point that
// one entry at this worker's copy, and fail loudly should a Vitest upgrade move it.
const workerState = (globalThis as { __vitest_worker__?: { providedContext?: Record<string, unknown> } }).__vitest_worker__;
if (workerState?.providedContext) workerState.providedContext.databaseUrl = databaseUrl;
if (inject('databaseUrl') !== databaseUrl) throw new Error("test/setup/api-env.ts could not point inject('databaseUrl') at this worker's database");

// Files of a worker share one process and module cache (isolate: false in vitest.config.ts): each file
// starts from the environment the worker started with, whatever the file before it set.
const startEnv = ((globalThis as { __loamlineStartEnv?: NodeJS.ProcessEnv }).__loamlineStartEnv ??= { ...process.env });
for (const key of Object.keys(process.env)) if (!(key in startEnv)) delete process.env[key];
Object.assign(process.env, startEnv);

// ConfigModule validates the environment when AppModule is imported, so it must be in place first.
Object.assign(process.env, {
  NODE_ENV: 'test',
  DATABASE_URL: databaseUrl,
  JWT_ACCESS_SECRET: randomBytes(32).toString('hex'),
  LOCAL_SMTP_PORT: '0',
  LOG_LEVEL: 'error',
  LOG_FORMAT: 'text',
  // Queued mail and renders are picked up within half a second (pg-boss's floor) instead of a second.
  QUEUE_POLL_INTERVAL_SECONDS: '0.5',
  // Each file starts its own app and most draw nothing: a drawing thread loads its layout and SVG
  // libraries (about 1.7 s of CPU) only when a file first asks for a drawing.
  DRAWING_THREADS_START: 'on-demand',
});
