import { describe, expect, it } from 'vitest';

import { analyzeAsBuilt } from '../domain/analysis/analyze.js';
import type { AsBuilt } from '../domain/as-built/as-built.schema.js';
import { DEMO_AS_BUILT } from '../domain/as-built/demo-as-built.js';
import { createNodeSvgCanvas } from './node-svg-window.js';
import { layoutSitePlan } from './site-plan-layout.js';
import { drawSitePlan, sitePlanLegendKeys } from './site-plan.js';

/*
 * Issue 21 on the packet's plan: run labels name the run and say when it went in, by which job, and
 * since when it is abandoned; indoor runs are drawn as indoor (never with a buried line), also when
 * spare or abandoned.
 */

const indoor = DEMO_AS_BUILT.runs.find((r) => r.method === 'indoor')!;
const buried = DEMO_AS_BUILT.runs.find((r) => r.method === 'direct_burial' && r.isSpare !== true && r.isAbandoned !== true)!;

function runLabel(model: ReturnType<typeof layoutSitePlan>, runId: string): string[] {
  return model.labels.find((l) => l.kind === 'run' && l.forId === runId)?.lines ?? [];
}

describe('site plan: run provenance and indoor runs', () => {
  it('prints the provenance lines under the run’s name and facts, and nothing extra without them', () => {
    const runProvenance = { [buried.id]: ['In since May 14, 2026, Garden speakers', 'Abandoned since Jun 2, 2027, Lawn rework'] };
    const model = layoutSitePlan(DEMO_AS_BUILT, analyzeAsBuilt(DEMO_AS_BUILT), { runProvenance });
    const lines = runLabel(model, buried.id);
    expect(lines[0]).toBe(buried.label);
    expect(lines.slice(2)).toEqual(runProvenance[buried.id]);
    const plain = layoutSitePlan(DEMO_AS_BUILT, analyzeAsBuilt(DEMO_AS_BUILT), {});
    expect(runLabel(plain, buried.id)).toHaveLength(2);
    const svg = drawSitePlan(DEMO_AS_BUILT, analyzeAsBuilt(DEMO_AS_BUILT), { createCanvas: createNodeSvgCanvas, runProvenance });
    expect(svg).toContain('Abandoned since Jun 2, 2027, Lawn rework');
  });

  it('draws an abandoned or spare indoor run as indoor, says so in its label, also with depths off', () => {
    for (const flag of [{ isAbandoned: true }, { isSpare: true }] as const) {
      const asBuilt: AsBuilt = { ...DEMO_AS_BUILT, runs: DEMO_AS_BUILT.runs.map((r) => (r.id === indoor.id ? { ...r, ...flag, route: [{ x: 0, y: 0 }, { x: 0, y: 2 }] } : r)) };
      const model = layoutSitePlan(asBuilt, analyzeAsBuilt(asBuilt), { layers: { depths: false } });
      expect(model.runs.find((r) => r.runId === indoor.id)?.style).toBe('indoor');
      const lines = runLabel(model, indoor.id);
      expect(lines[0]).toBe(`${'isAbandoned' in flag ? 'ABANDONED' : 'SPARE'}: ${indoor.label}`);
      expect(lines[1]).toContain('indoor, not buried');
      // With a route recorded, its line style is in the legend: the indoor one.
      const keys = sitePlanLegendKeys(model);
      expect(keys).toContain('run:indoor');
      // The demo has no other abandoned run: the buried-abandoned key would only come from this one.
      if ('isAbandoned' in flag) expect(keys).not.toContain('run:abandoned');
    }
  });

  it('still draws a buried abandoned run with the abandoned line', () => {
    const asBuilt: AsBuilt = { ...DEMO_AS_BUILT, runs: DEMO_AS_BUILT.runs.map((r) => (r.id === buried.id ? { ...r, isAbandoned: true } : r)) };
    const model = layoutSitePlan(asBuilt, analyzeAsBuilt(asBuilt), {});
    expect(model.runs.find((r) => r.runId === buried.id)?.style).toBe('abandoned');
    expect(runLabel(model, buried.id)[0]).toBe(`ABANDONED: ${buried.label}`);
  });
});
