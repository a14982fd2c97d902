// `npm run bench`: runs every bench/*.bench.ts in turn (with tsx; no DI involved) and prints their figures.
import { spawnSync } from 'node:child_process';
import { readdirSync } from 'node:fs';
import { join } from 'node:path';

import { ensureNpmDependencies, root } from './lib/setup.mjs';

ensureNpmDependencies();
const benches = readdirSync(join(root, 'bench')).filter((f) => f.endsWith('.bench.ts')).sort();
let failed = false;
for (const file of benches) {
  console.log(`\n== ${file} ==`);
  const result = spawnSync('npx', ['tsx', join('bench', file)], { cwd: root, stdio: 'inherit' });
  failed ||= result.status !== 0;
}
process.exit(failed ? 1 : 0);
