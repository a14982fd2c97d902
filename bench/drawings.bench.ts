/**
 * Drawing benchmark: `npx tsx bench/drawings.bench.ts`.
 * Times the three drawings (site plan, wiring schematic, one depth profile per run) for the demo job
 * and for the generated 500-item / 600-run job, median of N runs, with `analyzeAsBuilt` on the same job
 * measured in the same run as the baseline, so figures from different machines compare as a ratio.
 */
import { analyzeAsBuilt } from '../api/src/domain/analysis/analyze.js';
import { AsBuiltSchema, type AsBuilt } from '../api/src/domain/as-built/as-built.schema.js';
import { DEMO_AS_BUILT } from '../api/src/domain/as-built/demo-as-built.js';
import { generateSyntheticAsBuilt } from '../api/src/domain/as-built/synthetic-as-built.js';
import { drawDepthProfile } from '../api/src/drawings/depth-profile.js';
import { createNodeSvgCanvas } from '../api/src/drawings/node-svg-window.js';
import { drawSitePlan } from '../api/src/drawings/site-plan.js';
import { drawWiringSchematic } from '../api/src/drawings/wiring-schematic.js';
import { type BenchFigure, recordResults } from './results.js';

async function timeMs(fn: () => unknown, iterations: number, warmUp: number): Promise<number[]> {
  for (let i = 0; i < warmUp; i += 1) await fn();
  const out: number[] = [];
  for (let i = 0; i < iterations; i += 1) {
    const start = performance.now();
    await fn();
    out.push(performance.now() - start);
  }
  return out;
}

function median(samples: number[]): number {
  const sorted = [...samples].sort((a, b) => a - b);
  const mid = Math.floor(sorted.length / 2);
  return sorted.length % 2 === 1 ? sorted[mid]! : (sorted[mid - 1]! + sorted[mid]!) / 2;
}

const createCanvas = createNodeSvgCanvas;
const fmt = (ms: number): string => ms.toFixed(1).padStart(9);

const figures: BenchFigure[] = [];

async function benchJob(name: string, asBuilt: AsBuilt, iterations: number, warmUp: number): Promise<void> {
  const analysis = analyzeAsBuilt(asBuilt);
  const baseline = median(await timeMs(() => analyzeAsBuilt(asBuilt), iterations, warmUp));
  const plan = median(await timeMs(() => drawSitePlan(asBuilt, analysis, { createCanvas }), iterations, warmUp));
  const schematic = median(await timeMs(() => drawWiringSchematic(asBuilt, analysis, { createCanvas }), iterations, warmUp));
  const profiles = median(await timeMs(() => asBuilt.runs.forEach((r) => drawDepthProfile(asBuilt, analysis, r.id, { createCanvas })), iterations, warmUp));
  const total = plan + schematic + profiles;
  console.log(`${name} — ${asBuilt.items.length} items, ${asBuilt.runs.length} runs; median of ${iterations} after ${warmUp} warm-up`);
  console.log('                                         median ms   × analysis');
  const row = (label: string, ms: number): void => console.log(`${label.padEnd(40)} ${fmt(ms)}   ${(ms / baseline).toFixed(1).padStart(8)}`);
  row('baseline: analyzeAsBuilt', baseline);
  row('site plan', plan);
  row('wiring schematic (elkjs)', schematic);
  row(`depth profiles (all ${asBuilt.runs.length} runs)`, profiles);
  row('all three drawings', total);
  console.log('');
  figures.push(
    { label: `${name}: all three drawings, median`, value: total, unit: 'ms' },
    { label: `${name}: drawings / analysis`, value: total / baseline, unit: '×' },
  );
}

console.log(`Loamline drawings benchmark — node ${process.version}`);
console.log('');
await benchJob('demo job', DEMO_AS_BUILT, 15, 5);
await benchJob('synthetic job', AsBuiltSchema.parse(generateSyntheticAsBuilt()), 5, 1);
recordResults('drawings', figures);
