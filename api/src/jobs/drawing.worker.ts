import { parentPort } from 'node:worker_threads';

import type { WorkerReply } from '../common/worker-pool.js';
import { drawJobDepthProfile, drawJobSchematic, drawJobSitePlan } from '../drawings/job-drawings.js';
import { createNodeSvgCanvas } from '../drawings/node-svg-window.js';
import type { DrawingTask } from './drawing-task.js';

/**
 * One drawing thread: lays out (elkjs) and serialises (svg.js on svgdom) the drawing it is sent, off
 * the API's event loop. Runs the same drawing module as the packet and the web app.
 */
async function draw(task: DrawingTask): Promise<string> {
  const input = { asBuilt: task.asBuilt, analysis: task.analysis, createCanvas: createNodeSvgCanvas, units: task.units, locale: task.locale ?? null };
  switch (task.kind) {
    case 'site-plan':
      return drawJobSitePlan(input, task.sitePlan);
    case 'schematic':
      return drawJobSchematic(input);
    case 'depth-profile':
      return drawJobDepthProfile(input, task.runId);
  }
}

parentPort!.on('message', (task: DrawingTask) => {
  draw(task).then(
    (svg) => parentPort!.postMessage({ ok: true, value: svg } satisfies WorkerReply<string>),
    (error: unknown) => parentPort!.postMessage({ ok: false, message: error instanceof Error ? error.message : String(error) } satisfies WorkerReply<string>),
  );
});
