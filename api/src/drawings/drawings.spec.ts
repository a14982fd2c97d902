import fc from 'fast-check';
import { beforeAll, describe, expect, it } from 'vitest';

import { analyzeAsBuilt } from '../domain/analysis/analyze.js';
import { AsBuiltSchema, type AsBuilt } from '../domain/as-built/as-built.schema.js';
import { DEMO_AS_BUILT } from '../domain/as-built/demo-as-built.js';
import type { Item } from '../domain/as-built/item.schema.js';
import type { Run } from '../domain/as-built/run.schema.js';
import { generateSyntheticAsBuilt } from '../domain/as-built/synthetic-as-built.js';
import { drawDepthProfile } from './depth-profile.js';
import { createNodeSvgCanvas } from './node-svg-window.js';
import { chooseScale, formatScale, IMPERIAL_SCALES, ptPerPlanMetre } from './paper.js';
import { layoutSitePlan } from './site-plan-layout.js';
import { drawSitePlan, SITE_PLAN_NOTE, sitePlanLegendKeys } from './site-plan.js';
import { boxContains, boxesIntersect } from './text-box.js';
import { drawWiringSchematic } from './wiring-schematic.js';

interface XmlDocument {
  documentElement: XmlElement;
  getElementsByTagName(name: string): { length: number };
  querySelectorAll(selector: string): ArrayLike<XmlElement>;
  querySelector(selector: string): XmlElement | null;
}
interface XmlElement {
  getAttribute(name: string): string | null;
  textContent: string | null;
  querySelectorAll(selector: string): ArrayLike<XmlElement>;
  querySelector(selector: string): XmlElement | null;
  tagName: string;
}

let parseXml: (text: string) => XmlDocument;

beforeAll(async () => {
  // jsdom (a root dev dependency) has a strict XML DOMParser; svgdom 0.1.25 has none. Typed by hand:
  // jsdom ships no types and none are installed.
  const moduleName: string = 'jsdom';
  const { JSDOM } = (await import(moduleName)) as { JSDOM: new (html: string) => { window: { DOMParser: new () => { parseFromString(t: string, type: string): XmlDocument } } } };
  const parser = new new JSDOM('').window.DOMParser();
  parseXml = (text) => parser.parseFromString(text, 'image/svg+xml');
});

function parseSvg(svg: string): XmlDocument {
  const doc = parseXml(svg);
  expect(doc.getElementsByTagName('parsererror').length, 'SVG is not well-formed XML').toBe(0);
  expect(doc.documentElement.tagName).toBe('svg');
  return doc;
}

function all(doc: XmlDocument | XmlElement, selector: string): XmlElement[] {
  return Array.from(doc.querySelectorAll(selector));
}

function dataIds(doc: XmlDocument): Set<string> {
  return new Set(all(doc, '[data-id]').map((e) => e.getAttribute('data-id')!));
}

const demo = DEMO_AS_BUILT;
const demoAnalysis = analyzeAsBuilt(demo);
const opts = { createCanvas: createNodeSvgCanvas };

/**
 * The runs (other than `own`) whose drawn line passes through the label box, found by walking every
 * segment in 0.25 pt steps: independent of the placer's own clipping test.
 */
function runsAcross(box: { x: number; y: number; width: number; height: number }, runs: readonly { runId: string; points: readonly { x: number; y: number }[] }[], own?: string): string[] {
  const out: string[] = [];
  for (const run of runs) {
    if (run.runId === own) continue;
    // Runs wholly to one side of the box cannot touch it (a cheap first look: crowded jobs have hundreds).
    if (run.points.every((p) => p.x < box.x) || run.points.every((p) => p.x > box.x + box.width)) continue;
    if (run.points.every((p) => p.y < box.y) || run.points.every((p) => p.y > box.y + box.height)) continue;
    const hit = run.points.slice(1).some((b, i) => {
      const a = run.points[i]!;
      const steps = Math.max(1, Math.ceil(Math.hypot(b.x - a.x, b.y - a.y) / 0.25));
      for (let j = 0; j <= steps; j += 1) {
        const x = a.x + ((b.x - a.x) * j) / steps;
        const y = a.y + ((b.y - a.y) * j) / steps;
        if (x >= box.x && x <= box.x + box.width && y >= box.y && y <= box.y + box.height) return true;
      }
      return false;
    });
    if (hit) out.push(run.runId);
  }
  return out;
}

/** Every label of the plan with the runs it lies across that it does not name (a run's label may touch its own run). */
function labelsAcrossRuns(m: ReturnType<typeof layoutSitePlan>): string[] {
  return m.labels.flatMap((l) => runsAcross(l.box, m.runs, l.kind === 'run' ? l.forId : undefined).map((runId) => `${l.id} across ${runId}`));
}

function withRuns(base: AsBuilt, change: (run: Run) => Run): AsBuilt {
  return { ...base, runs: base.runs.map(change) };
}

describe('drawSitePlan', () => {
  const svg = drawSitePlan(demo, demoAnalysis, { ...opts, titleBlock: { title: 'Demo <job> & "yard"', revision: '2', date: '2026-05-14' } });
  const model = layoutSitePlan(demo, demoAnalysis, {});

  it('should be well-formed SVG sized in real paper units with a viewBox', () => {
    const doc = parseSvg(svg);
    const root = doc.documentElement;
    expect(root.getAttribute('width')).toBe('7.5in');
    expect(root.getAttribute('height')).toBe('10in');
    expect(root.getAttribute('viewBox')).toBe('0 0 540 720');
  });

  it('should fit A4 landscape in millimetres', () => {
    const root = parseSvg(drawSitePlan(demo, demoAnalysis, { ...opts, paper: 'a4', orientation: 'landscape' })).documentElement;
    expect(root.getAttribute('width')).toBe('271.6mm');
    expect(root.getAttribute('height')).toBe('184.6mm');
  });

  it('should contain every item and run id and every item label', () => {
    const doc = parseSvg(svg);
    const ids = dataIds(doc);
    for (const item of demo.items) expect(ids, item.id).toContain(item.id);
    for (const run of demo.runs) expect(ids, run.id).toContain(run.id);
    const labelTexts = all(doc, '[data-label-kind="item"]').map((g) => g.textContent);
    for (const item of demo.items) expect(labelTexts).toContain(item.label);
  });

  it('should escape user text', () => {
    expect(svg).toContain('Demo &lt;job&gt; &amp;');
    expect(parseSvg(svg).querySelector('[data-role="title"]')?.textContent).toBe('Demo <job> & "yard"');
  });

  it('should state the scale it is drawn at, the largest standard scale that fits', () => {
    // The demo is imperial. Its extent (x −0…22 m, y −3…16 m) fits 1/16 in = 1 ft but not 3/32 in = 1 ft
    // (22 m at 1:128 is 487 pt across, the frame less its label margins 444 pt), in either orientation.
    expect(model.scale).toEqual(IMPERIAL_SCALES.find((s) => s.ratio === 192));
    const doc = parseSvg(svg);
    expect(doc.querySelector('[data-role="scale"]')?.textContent).toBe(`Scale ${formatScale(model.scale!)}`);
    expect(doc.querySelector('[data-role="scale"]')?.textContent).toBe('Scale 1/16 in = 1 ft (1:192)');
    expect(model.ptPerMetre).toBeCloseTo(ptPerPlanMetre(192), 9);
    // The scale bar is as long on paper as it says: value (ft) × 0.3048 m × pt per metre.
    const bar = doc.querySelector('[data-role="scale-bar"]')!;
    const feet = Number(bar.getAttribute('data-length'));
    expect(Number(bar.getAttribute('data-width-pt'))).toBeCloseTo(feet * 0.3048 * ptPerPlanMetre(192), 1);
    const metric = layoutSitePlan(demo, demoAnalysis, { units: 'metric' });
    // 22 m at 1:150 is 146.7 mm = 416 pt ≤ 444 pt; at 1:125, 176 mm = 499 pt does not fit.
    expect(metric.scale?.label).toBe('1:150');
    expect(chooseScale(22, 19, 540 - 96, 720 - 152 - 60, 'metric')?.label).toBe('1:150');
  });

  it('should draw a run without a route as a dotted straight line with a note', () => {
    const doc = parseSvg(svg);
    const trunk = doc.querySelector('[data-id="run-trunk-in"]')!;
    expect(trunk.getAttribute('data-route')).toBe('not-recorded');
    expect(all(trunk, 'polyline')[0]!.getAttribute('stroke-dasharray')).toBeTruthy();
    expect(doc.querySelector('[data-label-for="run-trunk-in"]')?.textContent).toContain('route not recorded');
    expect(sitePlanLegendKeys(model)).toContain('route_not_recorded');
  });

  it('should draw spare and abandoned runs distinctly and name them in the legend', () => {
    const ab = withRuns(demo, (r) => (r.id === 'run-s3' ? { ...r, isAbandoned: true } : r));
    const doc = parseSvg(drawSitePlan(ab, analyzeAsBuilt(ab), opts));
    const style = (id: string): string => {
      const g = doc.querySelector(`[data-id="${id}"]`)!;
      return all(g, 'polyline')
        .map((p) => `${p.getAttribute('stroke')}|${p.getAttribute('stroke-width')}|${p.getAttribute('stroke-dasharray')}`)
        .join(';');
    };
    expect(doc.querySelector('[data-id="run-spare"]')?.getAttribute('data-style')).toBe('spare');
    expect(doc.querySelector('[data-id="run-s3"]')?.getAttribute('data-style')).toBe('abandoned');
    const direct = style('run-p1');
    expect(new Set([direct, style('run-spare'), style('run-s3')]).size).toBe(3);
    // Abandoned runs carry crosses, so they differ in shape, not only colour.
    expect(all(doc.querySelector('[data-id="run-s3"]')!, 'path').length).toBeGreaterThan(0);
    const legend = all(doc, '[data-legend]').map((e) => e.getAttribute('data-legend'));
    expect(legend).toContain('run:spare');
    expect(legend).toContain('run:abandoned');
    expect(doc.querySelector('[data-label-for="run-spare"]')?.textContent).toContain('SPARE');
    expect(doc.querySelector('[data-label-for="run-s3"]')?.textContent).toContain('ABANDONED');
  });

  it('should list in the legend only what is on the drawing', () => {
    const legend = all(parseSvg(svg), '[data-legend]').map((e) => e.getAttribute('data-legend'));
    expect(legend).toEqual([
      'amplifier',
      'speaker',
      'subwoofer',
      'junction',
      'spare_end',
      'wall_entry',
      'reference_point',
      'accuracy',
      'run:direct_burial',
      'run:under_hardscape_sleeve',
      'run:spare',
      'route_not_recorded',
      'shallow',
    ]);
    const bare = parseSvg(drawSitePlan(demo, demoAnalysis, { ...opts, layers: { referencePoints: false, spareAndAbandoned: false, depths: false } }));
    const bareLegend = all(bare, '[data-legend]').map((e) => e.getAttribute('data-legend'));
    expect(bareLegend).not.toContain('reference_point');
    expect(bareLegend).not.toContain('tie');
    expect(bareLegend).not.toContain('accuracy');
    expect(bare.querySelector('[data-accuracy-for]')).toBeNull();
    expect(bareLegend).not.toContain('run:spare');
    expect(bareLegend).not.toContain('shallow');
    expect(bare.querySelector('[data-id="run-spare"]')).toBeNull();
  });

  it('should circle each position solved from ties by its accuracy radius, and no other', () => {
    // The radius is the solver's own estimate (domain/geometry/ties.ts: DRMS = σ·√trace((JᵀJ)⁻¹), the
    // standard least-squares error propagation); the drawing only scales it to paper.
    const circles = all(parseSvg(svg), '[data-accuracy-for]');
    const expected = demoAnalysis.positions.filter((p) => p.source === 'ties' && (p.accuracyM ?? 0) >= 0.05);
    expect(expected.length).toBeGreaterThan(0);
    expect(circles.map((c) => c.getAttribute('data-accuracy-for')).sort()).toEqual(expected.map((p) => p.itemId).sort());
    for (const circle of circles) {
      const position = expected.find((p) => p.itemId === circle.getAttribute('data-accuracy-for'))!;
      const ring = circle.querySelector('circle')!;
      expect(Number(ring.getAttribute('r'))).toBeCloseTo(position.accuracyM! * model.ptPerMetre, 1);
      expect(ring.getAttribute('stroke-dasharray')).not.toBeNull();
    }
    // The amplifier was placed by hand (accuracy 0.5 m): no circle, the circle is for tie solutions.
    expect(circles.some((c) => c.getAttribute('data-accuracy-for') === 'amp-1')).toBe(false);
  });

  it('should leave out accuracy circles under 5 cm', () => {
    const precise = { ...demoAnalysis, positions: demoAnalysis.positions.map((p) => (p.source === 'ties' ? { ...p, accuracyM: 0.049 } : p)) };
    expect(all(parseSvg(drawSitePlan(demo, precise, opts)), '[data-accuracy-for]')).toEqual([]);
  });

  it('should mark the shallow station on the plan', () => {
    const marks = all(parseSvg(svg), '[data-shallow-run]');
    expect(marks.map((m) => [m.getAttribute('data-shallow-run'), m.getAttribute('data-station-m')])).toEqual([['run-p2', '3']]);
  });

  it('should place no two labels on top of each other, all inside the frame', () => {
    expect(model.omittedLabelCount).toBe(0);
    // items, runs and reference points: 13 + 11 + 3 (the ties are on the ties sheet)
    expect(model.labels.length).toBe(13 + 11 + 3);
    expect(model.ties).toEqual([]);
    for (let i = 0; i < model.labels.length; i += 1) {
      expect(boxContains(model.frame, model.labels[i]!.box)).toBe(true);
      for (let j = i + 1; j < model.labels.length; j += 1) {
        expect(boxesIntersect(model.labels[i]!.box, model.labels[j]!.box), `${model.labels[i]!.id} / ${model.labels[j]!.id}`).toBe(false);
      }
    }
    // The drawn boxes are the model's boxes.
    expect(all(parseSvg(svg), '[data-box]').length).toBe(model.labels.length);
  });

  it('should lay no label across a run it does not name, near the splices too (demo, Letter and A4 metric)', () => {
    // Before the runs were obstacles, "Patio splice to P3" sat across the trunk and the subwoofer's label across the spare run.
    expect(labelsAcrossRuns(model)).toEqual([]);
    const a4 = layoutSitePlan(demo, demoAnalysis, { paper: 'a4', orientation: 'landscape', units: 'metric' });
    expect(labelsAcrossRuns(a4)).toEqual([]);
    expect(a4.omittedLabelCount).toBe(0);
    // Moved labels point back with a leader.
    expect(model.labels.filter((l) => l.leader !== null).length).toBeGreaterThan(0);
  });

  it('should carry the north arrow, the dig note and no external references', () => {
    const doc = parseSvg(svg);
    // Plan +y is 12° east of true north, so the arrow turns 12° anticlockwise.
    expect(doc.querySelector('[data-role="north-arrow"]')?.getAttribute('transform')).toMatch(/^rotate\(-12 /);
    expect(all(doc, '[data-role="note"]').map((e) => e.textContent).join(' ')).toContain(SITE_PLAN_NOTE);
    expect(svg).not.toMatch(/(href|src)="https?:/);
    expect(svg).toContain('font-family="Inter, sans-serif"');
  });

  it('should be deterministic', () => {
    expect(drawSitePlan(demo, demoAnalysis, { ...opts, titleBlock: { title: 'Demo <job> & "yard"', revision: '2', date: '2026-05-14' } })).toBe(svg);
  });

  it('should say "not to scale" and list the items when no position is known', () => {
    const unplaced: AsBuilt = { ...demo, items: demo.items.map((i) => ({ ...i, position: undefined, ties: undefined }) as Item), runs: demo.runs.map((r) => ({ ...r, route: undefined })) };
    const doc = parseSvg(drawSitePlan(unplaced, analyzeAsBuilt(unplaced), { ...opts, layers: { referencePoints: false } }));
    expect(doc.querySelector('[data-role="not-to-scale"]')?.textContent).toBe('NOT TO SCALE');
    expect(doc.querySelector('[data-role="scale"]')?.textContent).toBe('Scale: NOT TO SCALE');
    expect(doc.querySelector('[data-role="scale-bar"]')).toBeNull();
    const ids = dataIds(doc);
    for (const item of demo.items) expect(ids).toContain(item.id);
  });

  it('should draw a calibrated data: plan image underneath and refuse any other URL', () => {
    const planImage = {
      href: 'data:image/png;base64,iVBORw0KGgo=',
      widthPx: 1000,
      heightPx: 800,
      calibration: { imageA: { x: 100, y: 700 }, imageB: { x: 600, y: 700 }, distanceM: 10 },
    };
    const doc = parseSvg(drawSitePlan(demo, demoAnalysis, { ...opts, planImage }));
    const image = doc.querySelector('image')!;
    // 500 px = 10 m → the 1000 px image is 20 m wide on the plan.
    expect(Number(image.getAttribute('width'))).toBeCloseTo(20 * ptPerPlanMetre(192), 1);
    expect(image.getAttribute('href')).toBe(planImage.href);
    expect(() => drawSitePlan(demo, demoAnalysis, { ...opts, planImage: { ...planImage, href: 'https://example.test/plan.png' } })).toThrow(/data: URL/);
  });

  it('should keep labels apart on a generated crowded job (property)', () => {
    const job = fc.record({
      n: fc.integer({ min: 2, max: 40 }),
      spread: fc.double({ min: 0.5, max: 60, noNaN: true }),
      seed: fc.integer({ min: 1, max: 1_000_000 }),
      labelChars: fc.integer({ min: 3, max: 50 }),
    });
    fc.assert(
      fc.property(job, ({ n, spread, seed, labelChars }) => {
        let s = seed;
        const rand = (): number => {
          s = (s * 16807) % 2147483647;
          return s / 2147483647;
        };
        const items: Item[] = Array.from({ length: n }, (_, i) => ({
          id: `sp-${i}`,
          kind: 'speaker',
          label: `Speaker ${i} ${'x'.repeat(labelChars)}`.slice(0, 120),
          nominalImpedanceOhm: 8,
          position: { x: rand() * spread, y: rand() * spread * 0.7, source: 'manual' },
        }));
        const runs: Run[] = items.slice(1).map((item, i) => ({
          id: `run-${i}`,
          label: `Run ${i} to ${item.label}`.slice(0, 120),
          fromItemId: items[i]!.id,
          toItemId: item.id,
          cableType: '14/2 direct burial',
          gauge: { system: 'awg', awg: 14 },
          conductors: 2,
          pairs: [],
          measuredLengthM: 5,
          method: 'direct_burial',
          route: i % 3 === 0 ? undefined : [items[i]!.position!, item.position!],
          depthReadings: [{ stationM: 1, depthM: 0.1 }],
        }));
        const asBuilt = AsBuiltSchema.parse({ zones: [], referencePoints: [{ id: 'rp', label: 'Corner', x: 0, y: 0 }], items, runs, checks: [] });
        const m = layoutSitePlan(asBuilt, analyzeAsBuilt(asBuilt), { units: 'metric' });
        for (let i = 0; i < m.labels.length; i += 1) {
          expect(boxContains(m.frame, m.labels[i]!.box)).toBe(true);
          for (let j = i + 1; j < m.labels.length; j += 1) expect(boxesIntersect(m.labels[i]!.box, m.labels[j]!.box)).toBe(false);
        }
        expect(m.labels.length + m.omittedLabelCount).toBe(n + runs.length + 1);
        expect(labelsAcrossRuns(m)).toEqual([]);
      }),
      { numRuns: 40 },
    );
  }, 60_000);
});

describe('drawSitePlan: the legend spelled for the company locale (issue 16)', () => {
  // A house footprint, so the legend has its grey (gray) feature entry.
  const withHouse: AsBuilt = {
    ...demo,
    site: { ...demo.site, features: [{ id: 'house', kind: 'house', name: 'House', shape: 'polygon', points: [{ x: -6, y: -4 }, { x: 6, y: -4 }, { x: 6, y: -1 }, { x: -6, y: -1 }] }] },
  };
  const legendWords = (locale?: string) => {
    const doc = parseSvg(drawSitePlan(withHouse, demoAnalysis, { ...opts, ...(locale ? { locale } : {}) }));
    return { key: doc.querySelector('[data-role="colour-key"]')?.textContent, feature: doc.querySelector('[data-legend="feature"]')?.textContent };
  };

  // Spellings: Merriam-Webster (American "color", "gray") and the Oxford English Dictionary (British "colour", "grey").
  it.each([
    [undefined, 'color', 'gray'],
    ['en-US', 'color', 'gray'],
    ['en-GB', 'colour', 'grey'],
    ['en-CA', 'colour', 'grey'],
  ] as const)('should spell the colour key and the features in %s as "%s" and "%s"', (locale, color, gray) => {
    const words = legendWords(locale);
    expect(words.key).toBe(`Orange: buried signal cable (APWA ${color} code)`);
    expect(words.feature).toBe(`House, fence, path … (${gray})`);
  });
});

describe('drawSitePlan: ties sheet and paper orientation', () => {
  const tiesModel = layoutSitePlan(demo, demoAnalysis, { sheet: 'ties' });
  const tieCount = demo.items.reduce((n, item) => n + (item.ties ?? []).filter((t) => demo.referencePoints.some((rp) => rp.id === t.referencePointId)).length, 0);

  const expectApart = (m: ReturnType<typeof layoutSitePlan>): void => {
    for (let i = 0; i < m.labels.length; i += 1) {
      expect(boxContains(m.frame, m.labels[i]!.box)).toBe(true);
      for (let j = i + 1; j < m.labels.length; j += 1) {
        expect(boxesIntersect(m.labels[i]!.box, m.labels[j]!.box), `${m.labels[i]!.id} / ${m.labels[j]!.id}`).toBe(false);
      }
    }
  };

  it('should draw reference points, items and every tie with its taped distance, and no run or landmark', () => {
    expect(tiesModel.runs).toEqual([]);
    expect(tiesModel.features).toEqual([]);
    expect(tiesModel.references.length).toBe(demo.referencePoints.length);
    expect(tiesModel.ties.length).toBe(tieCount);
    const tieLabels = tiesModel.labels.filter((l) => l.kind === 'tie');
    expect(tieLabels.length + tiesModel.omittedLabelCount).toBe(tieCount);
    // Written by the one formatter in the job's units: feet and inches, never `26'-3"`.
    for (const label of tieLabels) expect(label.lines[0]).toMatch(/^\d+ ft( \d+ in)?$|^0 ft \d+ in$/);
    expectApart(tiesModel);
    const doc = parseSvg(drawSitePlan(demo, demoAnalysis, { ...opts, sheet: 'ties' }));
    expect(doc.documentElement.getAttribute('data-drawing')).toBe('ties');
    expect(doc.querySelector('[data-role="sheet-title"]')?.textContent).toMatch(/^TIES/);
    expect(all(doc, '[data-tie]').length).toBe(tieCount);
    expect(all(doc, '[data-kind="run"]')).toEqual([]);
  });

  it('should lay no label across another run on a crowded generated job, counting those left off (500 items)', () => {
    const crowded = generateSyntheticAsBuilt(7);
    const m = layoutSitePlan(crowded, analyzeAsBuilt(crowded), { units: 'imperial' });
    expect(m.labels.length).toBeGreaterThan(50);
    expect(labelsAcrossRuns(m)).toEqual([]);
    // What found no spot clear of the runs is left off and counted (the plan says how many).
    const named = m.labels.filter((l) => l.kind !== 'feature').length;
    expect(named + m.omittedLabelCount).toBe(m.items.length + m.runs.length + m.references.length);
    expect(m.omittedLabelCount).toBeGreaterThan(0);
  }, 60_000);

  it('should keep labels apart on the ties sheet of a crowded generated job (500 items, 3 reference points)', () => {
    const crowded = generateSyntheticAsBuilt(7);
    const m = layoutSitePlan(crowded, analyzeAsBuilt(crowded), { sheet: 'ties', units: 'imperial' });
    expect(m.ties.length).toBeGreaterThan(500);
    expect(m.labels.length).toBeGreaterThan(20);
    expectApart(m);
  });

  it('should turn the sheet to landscape when a wide plan is drawn at a larger scale that way', () => {
    const wide: AsBuilt = {
      ...demo,
      referencePoints: demo.referencePoints.map((rp) => ({ ...rp, x: rp.x * 3 })),
      items: demo.items.map((item) => (item.position ? ({ ...item, position: { ...item.position, x: item.position.x * 3 } } as Item) : item)),
      runs: demo.runs.map((run) => (run.route ? { ...run, route: run.route.map((p) => ({ ...p, x: p.x * 3 })) } : run)),
    };
    const analysis = analyzeAsBuilt(wide);
    const portrait = layoutSitePlan(wide, analysis, { orientation: 'portrait' });
    const auto = layoutSitePlan(wide, analysis, { orientation: 'auto' });
    expect(auto.area.orientation).toBe('landscape');
    expect(auto.scale!.ratio).toBeLessThan(portrait.scale!.ratio);
    // The demo is drawn at 1:192 either way: the sheet it fills more of wins (landscape: 19 m of depth on
    // 328 pt of frame height, 85 %; portrait: 22 m across 444 pt, 73 %).
    const demoAuto = layoutSitePlan(demo, demoAnalysis, { orientation: 'auto' });
    expect(demoAuto.scale?.ratio).toBe(192);
    expect(demoAuto.area.orientation).toBe('landscape');
    // The drawn extent fills the frame in one direction to within one step of the scale list.
    expect(Math.max(auto.fill.width, auto.fill.height)).toBeGreaterThan(0.6);
    expectApart(auto);
  });

  it('should leave room on the page for a heading: shorter by the headroom, the scale still true', () => {
    const m = layoutSitePlan(demo, demoAnalysis, { headroomPt: 54 });
    expect(m.area.heightPt).toBeCloseTo(720 - 54, 6);
    expect(m.area.heightAttr).toBe('9.25in');
    expect(m.ptPerMetre).toBeCloseTo(ptPerPlanMetre(m.scale!.ratio), 9);
  });
});

describe('drawDepthProfile', () => {
  it('should highlight exactly the shallow station of the demo run to P2', () => {
    const doc = parseSvg(drawDepthProfile(demo, demoAnalysis, 'run-p2', opts));
    const root = doc.documentElement;
    expect(root.getAttribute('width')).toBe('3.5in');
    expect(root.getAttribute('height')).toBe('1.6in');
    expect(root.getAttribute('viewBox')).toBe('0 0 252 115.2');
    expect(root.getAttribute('data-id')).toBe('run-p2');
    const readings = all(doc, '[data-shallow]');
    expect(readings.length).toBe(3);
    const shallow = readings.filter((r) => r.getAttribute('data-shallow') === 'true');
    expect(shallow.map((r) => r.getAttribute('data-station-m'))).toEqual(['3']);
    // Shape and fill both differ: a black triangle against white circles (no marking colour: APWA
    // uniform colour code, CGA Best Practices, gives red to electric power).
    expect(shallow[0]!.tagName).toBe('polygon');
    expect(shallow[0]!.getAttribute('fill')).toBe('#000000');
    expect(readings.filter((r) => r.getAttribute('data-shallow') === 'false').every((r) => r.tagName === 'circle')).toBe(true);
    expect(doc.querySelector('[data-role="shallow-label"]')?.textContent).toBe('4 3/8 in shallow');
  });

  it('should draw the required cover from the analysis with its value and basis', () => {
    const doc = parseSvg(drawDepthProfile(demo, demoAnalysis, 'run-spa-trunk', { ...opts, units: 'metric' }));
    const cover = doc.querySelector('[data-role="required-cover"]')!;
    expect(cover.getAttribute('data-min-cover-m')).toBe('0.1');
    expect(doc.querySelector('[data-role="required-cover-label"]')?.textContent).toBe('required cover 10 cm(common practice)');
    expect(all(cover, 'title')[0]!.textContent).toContain('Table 300.5');
    expect(all(doc, '[data-shallow="true"]').length).toBe(0);
  });

  it('should say so when a run is indoor or has no readings, and refuse an unknown run', () => {
    expect(parseSvg(drawDepthProfile(demo, demoAnalysis, 'run-trunk-in', opts)).querySelector('[data-role="no-profile"]')?.textContent).toContain('not buried');
    expect(() => drawDepthProfile(demo, demoAnalysis, 'nope', opts)).toThrow(/no run/);
  });

  it('should draw every demo run deterministically', () => {
    for (const run of demo.runs) {
      const svg = drawDepthProfile(demo, demoAnalysis, run.id, opts);
      parseSvg(svg);
      expect(drawDepthProfile(demo, demoAnalysis, run.id, opts)).toBe(svg);
    }
  });
});

describe('drawWiringSchematic', () => {
  let svg: string;
  let doc: XmlDocument;
  beforeAll(async () => {
    svg = await drawWiringSchematic(demo, demoAnalysis, { ...opts, orientation: 'auto' });
    doc = parseSvg(svg);
  });

  it('should print every text at 8 pt or larger once scaled to the packet page', async () => {
    // As the packet draws it (packet-document.ts): its drawing page less the heading, no finding badges
    // (the findings are in the Engineering notes), the sheet turned whichever way prints the graph larger.
    const packetDoc = parseSvg(
      await drawWiringSchematic(demo, demoAnalysis, { ...opts, orientation: 'auto', margins: { acrossPt: 72, downPt: 90 }, headroomPt: 44, showFindings: false }),
    );
    const root = packetDoc.documentElement;
    const scale = Number(root.getAttribute('data-scale'));
    expect(Number(root.getAttribute('data-min-text-pt'))).toBeGreaterThanOrEqual(8);
    // Text inside the scaled graph groups prints at its size × the group's scale.
    const scaled = new Set(all(packetDoc, '[data-layer="graph"] text, [data-layer="unconnected"] text'));
    expect(all(packetDoc, '[data-finding]')).toEqual([]);
    for (const text of all(packetDoc, 'text')) {
      const printed = Number(text.getAttribute('font-size')) * (scaled.has(text) ? scale : 1);
      expect(printed, text.textContent ?? '').toBeGreaterThanOrEqual(8 - 1e-9);
    }
  });

  it('should mark + and − where each live pair is connected', () => {
    const live = all(doc, '[data-kind="run"][data-dead="false"]');
    expect(live.length).toBeGreaterThan(0);
    for (const edge of live) {
      const marks = all(edge, '[data-role="polarity"] text').map((t) => t.textContent);
      expect(marks, edge.getAttribute('data-edge') ?? '').toEqual(['+', '−']);
    }
    for (const edge of all(doc, '[data-kind="run"][data-dead="true"]')) expect(all(edge, '[data-role="polarity"]')).toEqual([]);
  });

  it('should name the channels a shared run carries by their names, not their ids', async () => {
    // As a recorded job has them: every id a database uuid-like string, the names as the crew typed them.
    const renamed = JSON.parse(JSON.stringify(demo).replaceAll('"ch-patio"', '"0d9c1f4e-patio"').replaceAll('"ch-spa"', '"7a2b8e31-spa"')) as AsBuilt;
    const text = all(parseSvg(await drawWiringSchematic(renamed, analyzeAsBuilt(renamed), opts)), 'text')
      .map((t) => t.textContent)
      .join(' ');
    expect(text).toContain('Patio + Spa');
    expect(text).not.toContain('0d9c1f4e');
  });

  it('should fit the page width in real units', () => {
    const root = doc.documentElement;
    expect(root.getAttribute('width')).toBe('7.5in');
    expect(root.getAttribute('viewBox')).toMatch(/^0 0 540 [\d.]+$/);
    expect(root.getAttribute('height')).toMatch(/^[\d.]+in$/);
  });

  it('should have one node per amplifier channel, speaker, subwoofer and junction', () => {
    expect(all(doc, '[data-kind="channel"]').map((n) => n.getAttribute('data-id'))).toEqual(['amp-1/ch-patio', 'amp-1/ch-spa']);
    const ofKind = (kind: string): string[] => all(doc, `[data-node][data-kind="${kind}"]`).map((n) => n.getAttribute('data-id')!).sort();
    expect(ofKind('speaker')).toEqual(['sp-p1', 'sp-p2', 'sp-p3', 'sp-s1', 'sp-s2', 'sp-s3']);
    expect(ofKind('subwoofer')).toEqual(['sub-1']);
    expect(ofKind('junction')).toEqual(['j-patio', 'j-spa']);
    const ids = dataIds(doc);
    for (const run of demo.runs) expect(ids).toContain(run.id);
  });

  it('should show each channel load with and without cable and each speaker loss', () => {
    const patio = doc.querySelector('[data-id="amp-1/ch-patio"]')!;
    expect(patio.textContent).toContain('load 4 Ω4.18 Ω with cable');
    expect(patio.textContent).toContain('4.18 Ω with cable');
    expect(patio.textContent).toContain('amp minimum 4 Ω');
    expect(doc.querySelector('[data-id="amp-1/ch-spa"]')?.textContent).toContain('load 5.33 Ω5.61 Ω with cable');
    expect(doc.querySelector('[data-node][data-id="sp-p1"]')?.textContent).toContain('level drop 0.38 dB');
    expect(doc.querySelector('[data-node][data-id="sub-1"]')?.textContent).toContain('series = 16 Ω');
  });

  it('should mark the shallow-depth finding on its run and draw the spare run dashed', () => {
    const badges = all(doc, '[data-layer="graph"] [data-severity]');
    expect(badges.length).toBe(1);
    expect(doc.querySelector('[data-id="run-p2"] [data-severity="warning"]')).not.toBeNull();
    expect(doc.querySelector('[data-id="run-spare"]')?.getAttribute('data-dead')).toBe('true');
    expect(all(doc.querySelector('[data-id="run-spare"]')!, 'polyline')[0]!.getAttribute('stroke-dasharray')).toBeTruthy();
  });

  it('should tell critical from warning by shape', async () => {
    const strict: AsBuilt = { ...demo, items: demo.items.map((i) => (i.kind === 'amplifier' ? { ...i, minimumImpedanceOhm: 8 } : i)) };
    const d = parseSvg(await drawWiringSchematic(strict, analyzeAsBuilt(strict), opts));
    const critical = d.querySelector('[data-id="amp-1/ch-patio"] [data-severity="critical"] polygon')!;
    expect(critical.getAttribute('points')!.split(' ').length).toBe(8);
    const warning = d.querySelector('[data-id="run-p2"] [data-severity="warning"] polygon')!;
    expect(warning.getAttribute('points')!.split(' ').length).toBe(3);
  });

  it('should be deterministic', async () => {
    expect(await drawWiringSchematic(demo, demoAnalysis, opts)).toBe(svg);
  });
});

