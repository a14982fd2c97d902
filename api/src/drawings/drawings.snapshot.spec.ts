import { describe, expect, it } from 'vitest';

import { analyzeAsBuilt } from '../domain/analysis/analyze.js';
import { DEMO_AS_BUILT } from '../domain/as-built/demo-as-built.js';
import { drawDepthProfile } from './depth-profile.js';
import { createNodeSvgCanvas } from './node-svg-window.js';
import { drawSitePlan } from './site-plan.js';
import { drawWiringSchematic } from './wiring-schematic.js';

// Human-viewable snapshots of the demo job's drawings: open test/print/__snapshots__/*.svg in a browser.
// Update on purpose only: `npx vitest run --project api api/src/drawings -u`.
const DIR = '../../../test/print/__snapshots__';
const analysis = analyzeAsBuilt(DEMO_AS_BUILT);
const titleBlock = { title: 'Rear-yard audio, 14 Larkspur Way', subtitle: 'Demo job (invented)', revision: '2', date: '2026-05-14', preparedBy: 'Quillmoss Outdoor Audio' };
const createCanvas = createNodeSvgCanvas;

describe('demo job drawings (file snapshots)', () => {
  it('should match the site plan on Letter, imperial', async () => {
    await expect(drawSitePlan(DEMO_AS_BUILT, analysis, { createCanvas, titleBlock })).toMatchFileSnapshot(`${DIR}/site-plan-letter.svg`);
  });

  it('should match the site plan on A4 landscape, metric', async () => {
    await expect(drawSitePlan(DEMO_AS_BUILT, analysis, { createCanvas, titleBlock, paper: 'a4', orientation: 'landscape', units: 'metric' })).toMatchFileSnapshot(
      `${DIR}/site-plan-a4-landscape-metric.svg`,
    );
  });

  it('should match the wiring schematic', async () => {
    await expect(await drawWiringSchematic(DEMO_AS_BUILT, analysis, { createCanvas })).toMatchFileSnapshot(`${DIR}/wiring-schematic.svg`);
  });

  it.each(['run-p2', 'run-spa-trunk', 'run-trunk-in'])('should match the depth profile of %s', async (runId) => {
    await expect(drawDepthProfile(DEMO_AS_BUILT, analysis, runId, { createCanvas })).toMatchFileSnapshot(`${DIR}/depth-profile-${runId}.svg`);
  });
});
