import { availableParallelism } from 'node:os';

import type { TestProject } from 'vitest/node';

// @ts-expect-error -- plain ESM script shared with `npm start`; no type declarations.
import { cloneDatabase, ensureDatabase, ensurePostgres, migrate, stopPostgres } from '../../scripts/lib/setup.mjs';

declare module 'vitest' {
  export interface ProvidedContext {
    /** This project's database; in a worker of a parallel project, that worker's own copy (test/setup/api-env.ts). */
    databaseUrl: string;
    /** One database per worker (index = VITEST_POOL_ID - 1), each a copy of the migrated project database. */
    workerDatabaseUrls: string[];
    /** Set in a project's `provide` (vitest.config.ts) to give each of its workers its own database. */
    perWorkerDatabases?: boolean;
    /** The file filters of this `vitest run` (none: every file), for test/support/file-parts.ts. */
    testFileFilters: string[];
  }
}

/** How many workers Vitest gives this project at once (the same rule as Vitest's own resolveMaxWorkers). */
function maxWorkersOf(project: TestProject): number {
  const configured = project.config.maxWorkers || project.vitest.config.maxWorkers;
  if (typeof configured === 'number' && configured > 0) return configured;
  return Math.max(availableParallelism() - 1, 1);
}

/**
 * Gives each test project its own empty database (`loamline_test_<project>`) on the local cluster (or
 * on the server named by DATABASE_URL), with every migration from drizzle/ applied. LOAMLINE_TEST_DB_TAG
 * (letters, digits, underscore) adds a suffix, so two checkouts or two people can run the suites side by
 * side on one cluster without dropping each other's database.
 *
 * A project whose files run in parallel and that asks for it (`provide: { perWorkerDatabases: true }`:
 * integration) also gets one copy per worker
 * (`loamline_test_<project>[_tag]_w<n>`, made with CREATE DATABASE … TEMPLATE, so migrations run once):
 * test/setup/api-env.ts points each worker at its own copy, so files running side by side never see each
 * other's rows, queue jobs or captured mail, and the files of one worker share a database as all files
 * did when they ran one after another.
 */
export default async function setup(project: TestProject): Promise<() => void> {
  const pg = ensurePostgres();
  const tag = process.env.LOAMLINE_TEST_DB_TAG ?? '';
  if (!/^[a-z0-9_]*$/i.test(tag)) throw new Error('LOAMLINE_TEST_DB_TAG may hold only letters, digits and underscores');
  const name = `loamline_test_${project.name}${tag ? `_${tag.toLowerCase()}` : ''}`;
  const databaseUrl: string = await ensureDatabase(pg, name, { fresh: true });
  await migrate(databaseUrl);
  const workers = project.getProvidedContext().perWorkerDatabases ? maxWorkersOf(project) : 1;
  const workerDatabaseUrls: string[] = [];
  if (workers === 1) workerDatabaseUrls.push(databaseUrl);
  // One after another: CREATE DATABASE … TEMPLATE needs the template to itself.
  else for (let i = 1; i <= workers; i += 1) workerDatabaseUrls.push(await cloneDatabase(pg, name, `${name}_w${i}`));
  project.provide('databaseUrl', databaseUrl);
  project.provide('workerDatabaseUrls', workerDatabaseUrls);
  // Vitest keeps the command line's file filters here (not a public field; absent means no filter).
  const filters = (project.vitest as unknown as { filenamePattern?: string[] }).filenamePattern;
  project.provide('testFileFilters', Array.isArray(filters) ? filters : []);
  return () => stopPostgres(pg);
}
