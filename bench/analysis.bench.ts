/**
 * Analysis benchmark: `npx tsx bench/analysis.bench.ts`.
 * Generates a 500-item, 600-run as-built, runs the full analysis repeatedly and prints median and p95
 * per analysis against the goal (< 20 ms), with a baseline on the same data (a JSON deep copy) so that
 * figures from noisy machines can be compared as a ratio.
 */
import { analyzeAsBuilt } from '../api/src/domain/analysis/analyze.js';
import { AsBuiltSchema } from '../api/src/domain/as-built/as-built.schema.js';
import { generateSyntheticAsBuilt } from '../api/src/domain/as-built/synthetic-as-built.js';
import { recordResults } from './results.js';

const GOAL_MS = 20;
const WARM_UP = 15;
const ITERATIONS = 50;

function time(fn: () => unknown, iterations: number): number[] {
  const out: number[] = [];
  for (let i = 0; i < iterations; i += 1) {
    const start = performance.now();
    fn();
    out.push(performance.now() - start);
  }
  return out;
}

function percentile(samples: number[], p: number): number {
  const sorted = [...samples].sort((a, b) => a - b);
  const index = Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1);
  return sorted[Math.max(0, index)]!;
}

const raw = generateSyntheticAsBuilt();
const asBuilt = AsBuiltSchema.parse(raw);
const sample = analyzeAsBuilt(asBuilt);

time(() => analyzeAsBuilt(asBuilt), WARM_UP);
time(() => JSON.parse(JSON.stringify(asBuilt)), WARM_UP);
time(() => AsBuiltSchema.parse(raw), 5);

const analysis = time(() => analyzeAsBuilt(asBuilt), ITERATIONS);
const baseline = time(() => JSON.parse(JSON.stringify(asBuilt)), ITERATIONS);
const validation = time(() => AsBuiltSchema.parse(raw), 20);

const med = percentile(analysis, 50);
const p95 = percentile(analysis, 95);
const baseMed = percentile(baseline, 50);
const fmt = (ms: number): string => ms.toFixed(2).padStart(8);

console.log(`Loamline analysis benchmark — ${asBuilt.items.length} items, ${asBuilt.runs.length} runs, ${sample.channels.length} channels, ${sample.findings.length} findings`);
console.log(`node ${process.version}, ${ITERATIONS} iterations after ${WARM_UP} warm-up`);
console.log('');
console.log('                                    median ms   p95 ms');
console.log(`full analysis (analyzeAsBuilt)     ${fmt(med)} ${fmt(p95)}`);
console.log(`baseline: JSON deep copy           ${fmt(baseMed)} ${fmt(percentile(baseline, 95))}`);
console.log(`schema validation (AsBuiltSchema)  ${fmt(percentile(validation, 50))} ${fmt(percentile(validation, 95))}   (not part of the goal)`);
console.log('');
console.log(`analysis / baseline ratio (median): ${(med / baseMed).toFixed(1)} ×`);
console.log(`goal: full analysis < ${GOAL_MS} ms (median) → ${med < GOAL_MS ? 'MET' : 'NOT MET'} (p95 ${p95 < GOAL_MS ? 'also under' : 'over'} the goal)`);

recordResults('analysis', [
  { label: `full analysis, ${asBuilt.items.length} items / ${asBuilt.runs.length} runs, median`, value: med, unit: 'ms', goal: `< ${GOAL_MS} ms`, isMet: med < GOAL_MS },
  { label: 'full analysis, p95', value: p95, unit: 'ms' },
  { label: 'analysis / JSON deep copy (median)', value: med / baseMed, unit: '×' },
]);
process.exitCode = med < GOAL_MS ? 0 : 1;
