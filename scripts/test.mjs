// `npm test`: the same set-up as `npm start` (packages, dependencies, PostgreSQL, builds), then every
// Vitest project. Each test project gets its own fresh database on the local cluster.
import { spawn, spawnSync } from 'node:child_process';
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

/** Starts a command, keeping its output (both streams, in order) for when it ends. */
function runInBackground(command, args) {
  return new Promise((resolve) => {
    const child = spawn(command, args, { cwd: root, stdio: ['ignore', 'pipe', 'pipe'] });
    const chunks = [];
    child.stdout.on('data', (chunk) => chunks.push(chunk));
    child.stderr.on('data', (chunk) => chunks.push(chunk));
    child.on('error', (error) => resolve({ status: 1, output: `${command}: ${error.message}\n` }));
    child.on('close', (status) => resolve({ status: status ?? 1, output: Buffer.concat(chunks).toString() }));
  });
}

let pg;
let status = 1;
try {
  ensureDebianPackages({ postgres: !process.env.DATABASE_URL, chromium: true, poppler: true, unzip: true });
  ensureNpmDependencies();
  // The linter needs neither the database nor the builds, so it runs beside them (linting a clean clone
  // without its cache took 25 s of CPU here) and its report is printed once it ends.
  const lint = runInBackground('npm', ['run', '--silent', 'lint']);
  pg = ensurePostgres();
  ensureApiBuilt();
  ensureWebBuilt();
  const linted = await lint;
  process.stdout.write(linted.output);
  if (linted.status !== 0) throw new Error('npm run lint found errors (see above)');
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
