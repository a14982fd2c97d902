// `npm run bench`: runs every bench/*.bench.ts in turn (with tsx; no DI involved), each printing its
// own figures and recording them in bench/results.json (git-ignored); then prints one summary table of
// every figure, marking any bench that did not record in this run. `npm run bench -- api` runs only the
// benches whose file name contains "api".
import { spawnSync } from 'node:child_process';
import { existsSync, readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';

import { ensureNpmDependencies, root } from './lib/setup.mjs';

ensureNpmDependencies();
const filters = process.argv.slice(2);
const benches = readdirSync(join(root, 'bench'))
  .filter((f) => f.endsWith('.bench.ts'))
  .filter((f) => filters.length === 0 || filters.some((part) => f.includes(part)))
  .sort();
const startedAt = new Date();
const failed = [];
for (const file of benches) {
  console.log(`\n== ${file} ==`);
  const result = spawnSync('npx', ['tsx', join('bench', file)], { cwd: root, stdio: 'inherit' });
  if (result.status !== 0) failed.push(file);
}

const resultsFile = join(root, 'bench', 'results.json');
const { benches: recorded = {} } = existsSync(resultsFile) ? JSON.parse(readFileSync(resultsFile, 'utf8')) : {};
const ran = new Set(benches.map((f) => f.replace(/\.bench\.ts$/, '')));

function formatValue(value, unit) {
  const digits = Math.abs(value) >= 100 ? 0 : Math.abs(value) >= 10 ? 1 : 2;
  return `${value.toFixed(digits)} ${unit}`;
}

console.log(`\n== summary (bench/results.json) ==`);
const rows = [];
for (const [name, entry] of Object.entries(recorded)) {
  if (filters.length > 0 && !ran.has(name)) continue;
  const isFresh = new Date(entry.recordedAt) >= startedAt;
  for (const figure of entry.figures) {
    const goal = figure.goal ? `${figure.goal} ${figure.isMet ? 'met' : 'NOT MET'}` : '';
    rows.push([name, figure.label, formatValue(figure.value, figure.unit), goal, isFresh ? '' : `(earlier run, ${entry.recordedAt})`]);
  }
}
const widths = [0, 1, 2, 3].map((i) => Math.max(...rows.map((r) => r[i].length), 0));
for (const row of rows) {
  console.log(`${row[0].padEnd(widths[0])}  ${row[1].padEnd(widths[1])}  ${row[2].padStart(widths[2])}  ${row[3].padEnd(widths[3])}  ${row[4]}`.trimEnd());
}
for (const name of ran) if (!recorded[name]) console.log(`${name}: no figures recorded`);
if (failed.length > 0) console.log(`\nfailed: ${failed.join(', ')}`);
process.exit(failed.length > 0 ? 1 : 0);
