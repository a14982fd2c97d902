import type { TestProject } from 'vitest/node';

// @ts-expect-error -- plain ESM script shared with `npm start`; no type declarations.
import { ensureDatabase, ensurePostgres, migrate, stopPostgres } from '../../scripts/lib/setup.mjs';

declare module 'vitest' {
  export interface ProvidedContext {
    databaseUrl: string;
  }
}

/**
 * Gives each test project its own empty database (`loamline_test_<project>`) on the local cluster (or
 * on the server named by DATABASE_URL), with every migration from drizzle/ applied.
 */
export default async function setup(project: TestProject): Promise<() => void> {
  const pg = ensurePostgres();
  const databaseUrl: string = await ensureDatabase(pg, `loamline_test_${project.name}`, { fresh: true });
  await migrate(databaseUrl);
  project.provide('databaseUrl', databaseUrl);
  return () => stopPostgres(pg);
}
