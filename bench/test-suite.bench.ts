/**
 * Test-suite benchmark: `npx tsx bench/test-suite.bench.ts` (part of `npm run bench`).
 *
 * Reports how long the last `npm test` took per Vitest project, so the slowest project (and its slowest
 * files) can be seen. It reads `.data/vitest-durations.json`, which `npm test` writes through
 * test/setup/suite-durations.reporter.ts (per file: import, set-up and test time, hooks included, and
 * when it ran). Without that file it falls back to `.data/vitest-report.json` (Vitest's JSON report,
 * which counts only the tests themselves, not beforeAll hooks or imports). With `--run` it first runs
 * `npm test` itself (about seven minutes on two cores).
 *
 * Figures: the whole run's wall-clock time (goal: under 10 minutes on two cores, DEVELOPERS.md), and per
 * project its wall-clock span (first file started → last file ended; projects overlap when they run in
 * parallel) and its worker time (sum of its files' durations).
 */
import { spawnSync } from 'node:child_process';
import { existsSync, readFileSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';

// @ts-expect-error -- plain ESM script shared with `npm start`; no type declarations.
import { dataDir, root } from '../scripts/lib/setup.mjs';
import type { FileDuration, SuiteDurations } from '../test/setup/suite-durations.reporter.js';
import { type BenchFigure, recordResults } from './results.js';

const GOAL_MINUTES = 10;
const durationsFile = join(dataDir as string, 'vitest-durations.json');
const reportFile = join(dataDir as string, 'vitest-report.json');

if (process.argv.includes('--run')) {
  const result = spawnSync('npm', ['test'], { cwd: root as string, stdio: 'inherit' });
  if (result.status !== 0) console.log(`npm test exited with ${result.status}; reporting its durations anyway`);
}

/** The project of a test file, from the include patterns of vitest.config.ts (for the JSON report only). */
function projectOf(file: string): string {
  if (file.startsWith('api/src/')) return 'api';
  if (file.startsWith('web/src/')) return 'web';
  if (file.startsWith('test/api/')) return 'integration';
  if (file.startsWith('test/e2e/')) return 'e2e';
  if (file.startsWith('test/system/')) return 'system';
  return 'other';
}

interface JsonReport {
  startTime: number;
  testResults: { name: string; startTime: number; endTime: number; status: string }[];
}

function fromJsonReport(): SuiteDurations {
  const report = JSON.parse(readFileSync(reportFile, 'utf8')) as JsonReport;
  const files = report.testResults.map((r): FileDuration => {
    const file = relative(root as string, r.name);
    return {
      project: projectOf(file),
      file,
      startedAt: r.startTime - report.startTime,
      endedAt: r.endTime - report.startTime,
      collect: 0,
      setup: 0,
      environment: 0,
      tests: r.endTime - r.startTime,
      state: r.status,
    };
  });
  const totalMs = Math.max(0, ...files.map((f) => f.endedAt));
  return { recordedAt: new Date(statSync(reportFile).mtime).toISOString(), totalMs, reason: 'passed', files };
}

let suite: SuiteDurations;
let source: string;
if (existsSync(durationsFile)) {
  suite = JSON.parse(readFileSync(durationsFile, 'utf8')) as SuiteDurations;
  source = relative(root as string, durationsFile);
} else if (existsSync(reportFile)) {
  suite = fromJsonReport();
  source = `${relative(root as string, reportFile)} (tests only: hooks and imports not counted)`;
} else {
  console.error('No test run recorded: run `npm test` first (or `npm run bench -- test-suite --run`).');
  process.exit(1);
}

if (suite.files.length === 0) {
  console.error(`${source} records no test file (did that run fail before its tests?): run \`npm test\` again.`);
  process.exit(1);
}

const seconds = (ms: number) => ms / 1000;
const busyOf = (f: FileDuration) => f.collect + f.setup + f.environment + f.tests;
console.log(`from ${source}, recorded ${suite.recordedAt} (${suite.files.length} files, run ${suite.reason})`);

const byProject = new Map<string, FileDuration[]>();
for (const file of suite.files) byProject.set(file.project, [...(byProject.get(file.project) ?? []), file]);
const projects = [...byProject.entries()]
  .map(([name, files]) => ({
    name,
    files,
    span: Math.max(...files.map((f) => f.endedAt)) - Math.min(...files.map((f) => f.startedAt)),
    busy: files.reduce((sum, f) => sum + busyOf(f), 0),
  }))
  .sort((a, b) => b.busy - a.busy);

const figures: BenchFigure[] = [
  {
    label: 'whole suite, wall clock',
    value: seconds(suite.totalMs),
    unit: 's',
    goal: `< ${GOAL_MINUTES * 60} s`,
    isMet: suite.totalMs < GOAL_MINUTES * 60_000,
  },
];
console.log(`\nwhole run: ${seconds(suite.totalMs).toFixed(1)} s (goal under ${GOAL_MINUTES} min)\n`);
console.log(`${'project'.padEnd(12)} ${'files'.padStart(5)} ${'wall s'.padStart(8)} ${'worker s'.padStart(9)}   slowest files (s)`);
for (const p of projects) {
  const slowest = [...p.files]
    .sort((a, b) => busyOf(b) - busyOf(a))
    .slice(0, 3)
    .map((f) => `${f.file.split('/').pop()} ${seconds(busyOf(f)).toFixed(1)}`)
    .join(', ');
  console.log(`${p.name.padEnd(12)} ${String(p.files.length).padStart(5)} ${seconds(p.span).toFixed(1).padStart(8)} ${seconds(p.busy).toFixed(1).padStart(9)}   ${slowest}`);
  figures.push({ label: `${p.name}: wall clock (first file start → last file end)`, value: seconds(p.span), unit: 's' });
  figures.push({ label: `${p.name}: worker time (sum of its files)`, value: seconds(p.busy), unit: 's' });
}
const failed = suite.files.filter((f) => f.state !== 'passed' && f.state !== 'skipped');
if (failed.length > 0) console.log(`\nnot passed in that run: ${failed.map((f) => f.file).join(', ')}`);

recordResults('test-suite', figures);
