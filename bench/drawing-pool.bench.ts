/**
 * Drawing pool benchmark: `npx tsx bench/drawing-pool.bench.ts` (issue 18 §3).
 * What the drawing routes cost the thread that answers requests: the event loop's delay (p99 and max,
 * perf_hooks.monitorEventLoopDelay) while the demo job's drawings are made — once on the main thread,
 * as the routes did before, and once through DrawingRenderer's worker pool — plus a render through the
 * pool and a cache hit. Lower delay means /api/health and every other request keep answering.
 */
import { monitorEventLoopDelay } from 'node:perf_hooks';

import type { ConfigService } from '@nestjs/config';

import { analyzeAsBuilt } from '../api/src/domain/analysis/analyze.js';
import { DEMO_AS_BUILT } from '../api/src/domain/as-built/demo-as-built.js';
import { drawJobDepthProfile, drawJobSchematic, drawJobSitePlan } from '../api/src/drawings/job-drawings.js';
import { createNodeSvgCanvas } from '../api/src/drawings/node-svg-window.js';
import { DrawingRenderer, drawingEtag } from '../api/src/jobs/drawing-renderer.js';
import type { DrawingTask } from '../api/src/jobs/drawing-task.js';
import { type BenchFigure, recordResults } from './results.js';

const asBuilt = DEMO_AS_BUILT;
const analysis = analyzeAsBuilt(asBuilt);
const tasks: DrawingTask[] = [];
for (const units of ['metric', 'imperial'] as const) {
  tasks.push({ kind: 'schematic', asBuilt, analysis, units });
  tasks.push({ kind: 'site-plan', asBuilt, analysis, units, sitePlan: { paper: 'letter' } });
  for (const run of asBuilt.runs.slice(0, 2)) tasks.push({ kind: 'depth-profile', asBuilt, analysis, units, runId: run.id });
}

function drawInline(task: DrawingTask): Promise<string> | string {
  const input = { asBuilt: task.asBuilt, analysis: task.analysis, createCanvas: createNodeSvgCanvas, units: task.units };
  if (task.kind === 'site-plan') return drawJobSitePlan(input, task.sitePlan);
  if (task.kind === 'schematic') return drawJobSchematic(input);
  return drawJobDepthProfile(input, task.runId);
}

/** Runs `work` while sampling the event loop's delay every 10 ms; returns the wall time and delays. */
async function withLoopDelay(work: () => Promise<unknown>): Promise<{ wallMs: number; p99Ms: number; maxMs: number }> {
  const histogram = monitorEventLoopDelay({ resolution: 10 });
  histogram.enable();
  const started = performance.now();
  await work();
  const wallMs = performance.now() - started;
  histogram.disable();
  return { wallMs, p99Ms: histogram.percentile(99) / 1e6, maxMs: histogram.max / 1e6 };
}

const config = { get: (key: string) => ({ DRAWING_THREADS: 1, DRAWING_THREADS_START: 'at-start', DRAWING_CACHE_MB: 64 })[key] } as unknown as ConfigService<never, true>;
const renderer = new DrawingRenderer(config as never);
await renderer.onModuleInit();
// Warm both paths (module loading, JIT) before measuring.
await drawInline(tasks[0]!);
await renderer.render(tasks[0]!, 'warm-up');

// Inline: one task per macrotask, as separate requests would run them on the main thread.
const inline = await withLoopDelay(async () => {
  for (const task of tasks) {
    await new Promise((resolve) => setImmediate(resolve));
    await drawInline(task);
  }
});
const pooled = await withLoopDelay(() => Promise.all(tasks.map((task, i) => renderer.render(task, `pooled-${i}`))));
const cold = performance.now();
await renderer.render(tasks[0]!, drawingEtag(tasks[0]!, { run: 'cold' }));
const coldMs = performance.now() - cold;
const hits: number[] = [];
for (let i = 0; i < 50; i += 1) {
  const started = performance.now();
  await renderer.render(tasks[0]!, drawingEtag(tasks[0]!, { run: 'cold' }));
  hits.push(performance.now() - started);
}
hits.sort((a, b) => a - b);
const hitMedian = hits[Math.floor(hits.length / 2)]!;
await renderer.onApplicationShutdown();

const fmt = (ms: number) => ms.toFixed(1).padStart(9);
console.log(`demo job — ${tasks.length} drawings (schematic, site plan, 2 depth profiles; metric and imperial)`);
console.log('                                        wall ms   loop p99 ms   loop max ms');
console.log(`${'on the main thread (before)'.padEnd(36)} ${fmt(inline.wallMs)}   ${fmt(inline.p99Ms)}   ${fmt(inline.maxMs)}`);
console.log(`${'in the drawing pool (1 thread)'.padEnd(36)} ${fmt(pooled.wallMs)}   ${fmt(pooled.p99Ms)}   ${fmt(pooled.maxMs)}`);
console.log(`schematic through the pool: ${coldMs.toFixed(1)} ms; from the cache: median ${hitMedian.toFixed(3)} ms`);

const figures: BenchFigure[] = [
  { label: 'event-loop delay p99 while drawing, main thread', value: inline.p99Ms, unit: 'ms' },
  { label: 'event-loop delay p99 while drawing, drawing pool', value: pooled.p99Ms, unit: 'ms', goal: '< 50 ms', isMet: pooled.p99Ms < 50 },
  { label: 'event-loop delay max while drawing, drawing pool', value: pooled.maxMs, unit: 'ms' },
  { label: 'schematic through the pool (cache miss)', value: coldMs, unit: 'ms' },
  { label: 'drawing from the cache, median', value: hitMedian, unit: 'ms' },
];
recordResults('drawing-pool', figures);
