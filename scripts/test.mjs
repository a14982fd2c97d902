// `npm test`: the same set-up as `npm start` (packages, dependencies, PostgreSQL, builds), then every
// Vitest project. Each test project gets its own fresh database on the local cluster.
import { spawnSync } from 'node:child_process';

import {
  ensureApiBuilt,
  ensureDebianPackages,
  ensureNpmDependencies,
  ensurePostgres,
  ensureWebBuilt,
  root,
  stopPostgres,
} from './lib/setup.mjs';

let pg;
let status = 1;
try {
  ensureDebianPackages({ postgres: !process.env.DATABASE_URL, chromium: true, poppler: true });
  ensureNpmDependencies();
  pg = ensurePostgres();
  ensureApiBuilt();
  ensureWebBuilt();
  const result = spawnSync('npx', ['vitest', 'run', ...process.argv.slice(2)], { cwd: root, stdio: 'inherit' });
  status = result.status ?? 1;
} catch (error) {
  console.error(`[loamline] ${error instanceof Error ? error.message : error}`);
} finally {
  stopPostgres(pg);
}
process.exit(status);
