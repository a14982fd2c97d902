import react from '@vitejs/plugin-react';
import { availableParallelism } from 'node:os';
import { fileURLToPath } from 'node:url';
import { defineConfig } from 'vitest/config';

const domain = fileURLToPath(new URL('./api/src/domain', import.meta.url));
const drawings = fileURLToPath(new URL('./api/src/drawings', import.meta.url));

// Nest's dependency injection needs decorator metadata; vite 8 transforms TypeScript with oxc.
const nestTransform = { decorator: { legacy: true, emitDecoratorMetadata: true } };

// Test files run side by side on every core: Vitest's default (cores - 1) would leave one of two cores
// idle. Projects that run in parallel must share this number (Vitest groups them); LOAMLINE_TEST_WORKERS
// overrides it. At most 4 by default: each integration worker runs a whole API (about 20 connections
// at most) against PostgreSQL's default limit of 100. Files of the `e2e` and `system` projects (browser
// flows; faults and load against real processes) run one at a time, after the rest.
const workers = Number(process.env.LOAMLINE_TEST_WORKERS) || Math.min(Math.max(availableParallelism(), 2), 4);

export default defineConfig({
  test: {
    maxWorkers: workers,
    projects: [
      {
        oxc: nestTransform,
        test: { name: 'api', environment: 'node', include: ['api/src/**/*.spec.ts'] },
      },
      {
        plugins: [react()],
        resolve: { alias: { '@domain': domain, '@drawings': drawings } },
        test: {
          name: 'web',
          environment: 'jsdom',
          include: ['web/src/**/*.spec.{ts,tsx}'],
          setupFiles: ['web/src/testing/setup-tests.ts'],
          // Fluent pages in jsdom are slow to query while the other projects load both cores.
          testTimeout: 20_000,
        },
      },
      {
        oxc: nestTransform,
        test: {
          name: 'integration',
          environment: 'node',
          include: ['test/api/**/*.int.spec.ts'],
          globalSetup: ['test/setup/database.global.ts'],
          setupFiles: ['test/setup/api-env.ts'],
          // Files run in parallel, each worker on its own copy of the database (test/setup/database.global.ts).
          provide: { perWorkerDatabases: true },
          testTimeout: 30_000,
          // An app bootstrap (beforeAll) takes far longer while the other workers load both cores.
          hookTimeout: 120_000,
        },
      },
      {
        test: {
          name: 'e2e',
          environment: 'node',
          include: ['test/e2e/**/*.e2e.spec.ts'],
          globalSetup: ['test/setup/database.global.ts', 'test/setup/server.global.ts', 'test/setup/browser.global.ts'],
          // One file at a time, after the parallel projects: browser steps have fixed time limits, and in
          // a full run beside the integration workers on two cores they ran out of them.
          fileParallelism: false,
          testTimeout: 60_000,
          hookTimeout: 120_000,
        },
      },
      {
        test: {
          name: 'journeys',
          environment: 'node',
          include: ['test/journeys/**/*.journey.spec.ts'],
          // No shared database or server: each journey runs scripts/start.mjs as `npm start` does (its own
          // data folder, PostgreSQL cluster and port, NODE_ENV=production, no SMTP_URL, no demo seed).
          // One file at a time, after the parallel projects; a first start initialises a cluster.
          fileParallelism: false,
          testTimeout: 900_000,
          hookTimeout: 660_000,
        },
      },
      {
        test: {
          name: 'system',
          environment: 'node',
          include: ['test/system/**/*.system.spec.ts'],
          globalSetup: ['test/setup/database.global.ts', 'test/system/support/build.global.ts'],
          fileParallelism: false,
          testTimeout: 120_000,
          hookTimeout: 120_000,
        },
      },
    ],
  },
});
