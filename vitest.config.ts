import react from '@vitejs/plugin-react';
import { availableParallelism } from 'node:os';
import { fileURLToPath } from 'node:url';
import { defineConfig } from 'vitest/config';

import WaitFirstSequencer from './test/setup/wait-first.sequencer';

const domain = fileURLToPath(new URL('./api/src/domain', import.meta.url));
const drawings = fileURLToPath(new URL('./api/src/drawings', import.meta.url));

// Nest's dependency injection needs decorator metadata; vite 8 transforms TypeScript with oxc.
const nestTransform = { decorator: { legacy: true, emitDecoratorMetadata: true } };

// Test files run side by side on every core: Vitest's default (cores - 1) would leave one of two cores
// idle. Projects that run in parallel must share this number (Vitest groups them); LOAMLINE_TEST_WORKERS
// overrides it. At most 4 by default: each integration worker runs a whole API (about 20 connections
// at most) against PostgreSQL's default limit of 100.
//
// Three groups, one after the other (sequence.groupOrder):
//   0. unit (api, web), integration and the journey (which mostly waits on its own `npm start`);
//   1. browser flows (e2e), two files at a time on the one shared server: each waits on Chromium and the
//      API far more than it computes, and alone after group 0 they left a core idle. The system tests of faults (a scratch PostgreSQL stopped, a render worker killed) share those two
//      workers: they mostly wait on their own processes;
//   2. the system tests that measure latency under load, one at a time, nothing beside them.
const workers = Number(process.env.LOAMLINE_TEST_WORKERS) || Math.min(Math.max(availableParallelism(), 2), 4);
const browserWorkers = Math.min(workers, 2);
// System tests of faults in processes of their own (PostgreSQL stopped on a scratch cluster, a render
// worker killed): they run beside the browser flows, not alone at the end.
const FAULT_TESTS = ['test/system/worker-kill.system.spec.ts', 'test/system/database-outage.system.spec.ts'];

export default defineConfig({
  test: {
    maxWorkers: workers,
    // Within each group, files that mostly wait start first (or go last) so they overlap with the rest.
    sequence: { sequencer: WaitFirstSequencer },
    projects: [
      {
        oxc: nestTransform,
        // Files of a worker share its module cache (on 2 cores: 25 s of CPU for the project instead of 66 s).
        test: { name: 'api', environment: 'node', include: ['api/src/**/*.spec.ts'], isolate: false },
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
          // Files share a worker's module cache instead of importing React, Fluent and the app again each
          // (measured side by side on 2 cores, 58 files: 126 s wall and 233 s CPU instead of 222 s and 417 s).
          // Each file's state is reset by setup-tests.ts (DOM cleanup, mocks restored, storage cleared).
          isolate: false,
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
          // Files of a worker share its module cache instead of importing Nest and the whole API again each:
          // on 2 cores, 10 files one after the other took 24 s of CPU instead of 53 s. Each file still starts
          // its own app (test/support/test-app.ts gives it the environment of the moment) and the worker's
          // environment is reset before each file (test/setup/api-env.ts).
          isolate: false,
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
          // After the unit and integration group: browser steps have fixed time limits, and beside the
          // integration workers on two cores they ran out of them. Two files at a time among themselves.
          sequence: { groupOrder: 1 },
          maxWorkers: browserWorkers,
          // Files of a worker share its module cache (Playwright and the test support load once a worker).
          isolate: false,
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
          // Beside the unit and integration tests (group 0): a journey waits on its own start far more
          // than it computes, and its time limits are long.
          testTimeout: 900_000,
          hookTimeout: 660_000,
        },
      },
      {
        test: {
          name: 'system-faults',
          environment: 'node',
          include: FAULT_TESTS,
          globalSetup: ['test/setup/database.global.ts', 'test/system/support/build.global.ts'],
          // Beside the browser flows (group 1, sharing its two workers): they wait on their own processes
          // (a killed render worker's lease running out, a scratch PostgreSQL cluster stopped and started)
          // far more than they compute, and their time limits are long.
          sequence: { groupOrder: 1 },
          maxWorkers: browserWorkers,
          testTimeout: 120_000,
          hookTimeout: 120_000,
        },
      },
      {
        test: {
          name: 'system',
          environment: 'node',
          include: ['test/system/**/*.system.spec.ts'],
          exclude: FAULT_TESTS,
          globalSetup: ['test/setup/database.global.ts', 'test/system/support/build.global.ts'],
          // Last and alone (one file at a time, nothing beside them): they measure latency under load.
          sequence: { groupOrder: 2 },
          fileParallelism: false,
          testTimeout: 120_000,
          hookTimeout: 120_000,
        },
      },
    ],
  },
});
