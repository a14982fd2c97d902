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
 * on the server named by DATABASE_URL), with every migration from drizzle/ applied. LOAMLINE_TEST_DB_TAG
 * (letters, digits, underscore) adds a suffix, so two checkouts or two people can run the suites side by
 * side on one cluster without dropping each other's database.
 */
export default async function setup(project: TestProject): Promise<() => void> {
  const pg = ensurePostgres();
  const tag = process.env.LOAMLINE_TEST_DB_TAG ?? '';
  if (!/^[a-z0-9_]*$/i.test(tag)) throw new Error('LOAMLINE_TEST_DB_TAG may hold only letters, digits and underscores');
  const name = `loamline_test_${project.name}${tag ? `_${tag.toLowerCase()}` : ''}`;
  const databaseUrl: string = await ensureDatabase(pg, name, { fresh: true });
  await migrate(databaseUrl);
  project.provide('databaseUrl', databaseUrl);
  return () => stopPostgres(pg);
}
