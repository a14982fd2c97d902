// `npm test`: the same set-up as `npm start` (packages, dependencies, PostgreSQL, builds), then every
// Vitest project. Each test project gets its own fresh database on the local cluster.
import { spawnSync } from 'node:child_process';
import { existsSync, readFileSync, rmSync } from 'node:fs';
import { join } from 'node:path';

import {
  ensureApiBuilt,
  ensureDebianPackages,
  ensureNpmDependencies,
  ensurePostgres,
  dataDir,
  ensureWebBuilt,
  root,
  stopPostgres,
} from './lib/setup.mjs';

let pg;
let status = 1;
try {
  ensureDebianPackages({ postgres: !process.env.DATABASE_URL, chromium: true, poppler: true, unzip: true });
  ensureNpmDependencies();
  if (spawnSync('npm', ['run', 'lint'], { cwd: root, stdio: 'inherit' }).status !== 0) throw new Error('npm run lint found errors (see above)');
  pg = ensurePostgres();
  ensureApiBuilt();
  ensureWebBuilt();
  const report = join(dataDir, 'vitest-report.json');
  rmSync(report, { force: true });
  const result = spawnSync(
    'npx',
    [
      'vitest',
      'run',
      '--reporter=default',
      '--reporter=json',
      `--outputFile.json=${report}`,
      // Per-file durations (imports and hooks included) for `npm run bench -- test-suite`.
      '--reporter=./test/setup/suite-durations.reporter.ts',
      ...process.argv.slice(2),
    ],
    // The builds above are what the browser and system tests run: their global set-ups need not hash the
    // sources again (nor rebuild half-way through the run when a file changes meanwhile).
    { cwd: root, stdio: 'inherit', env: { ...process.env, LOAMLINE_BUILDS_READY: '1' } },
  );
  status = result.status ?? 1;
  if (existsSync(report)) {
    // One plain closing line that any CI can read.
    const { numPassedTests, numFailedTests, numPendingTests } = JSON.parse(readFileSync(report, 'utf8'));
    console.log(`${numPassedTests} passed, ${numFailedTests} failed, ${numPendingTests} skipped`);
  }
} catch (error) {
  console.error(`[loamline] ${error instanceof Error ? error.message : error}`);
} finally {
  stopPostgres(pg);
}
process.exit(status);
