import react from '@vitejs/plugin-react';
import { fileURLToPath } from 'node:url';
import { defineConfig } from 'vitest/config';

const domain = fileURLToPath(new URL('./api/src/domain', import.meta.url));
const drawings = fileURLToPath(new URL('./api/src/drawings', import.meta.url));

// Nest's dependency injection needs decorator metadata; vite 8 transforms TypeScript with oxc.
const nestTransform = { decorator: { legacy: true, emitDecoratorMetadata: true } };

export default defineConfig({
  test: {
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
          fileParallelism: false,
          testTimeout: 30_000,
          hookTimeout: 60_000,
        },
      },
      {
        test: {
          name: 'e2e',
          environment: 'node',
          include: ['test/e2e/**/*.e2e.spec.ts'],
          globalSetup: ['test/setup/database.global.ts', 'test/setup/server.global.ts'],
          fileParallelism: false,
          testTimeout: 60_000,
          hookTimeout: 120_000,
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
