import { beforeAll, describe, expect, it } from 'vitest';

import { analyzeAsBuilt } from '../domain/analysis/analyze.js';
import type { AsBuilt } from '../domain/as-built/as-built.schema.js';
import { DEMO_AS_BUILT } from '../domain/as-built/demo-as-built.js';
import { DEMO_SITE_FEATURES } from '../domain/sites/demo-site-features.js';
import { drawDepthProfile } from './depth-profile.js';
import { APWA_COLOURS, colourKeyNote, legendText, MARKING_LEGEND, markingMeaning, REFERENCE_INK, RUN_ORANGE, RUN_STROKES, runStyleKey } from './marking-palette.js';
import { createNodeSvgCanvas } from './node-svg-window.js';
import { drawSitePlan } from './site-plan.js';
import { drawWiringSchematic } from './wiring-schematic.js';

/*
 * Marking colours by role. Source of the meanings: APWA Uniform Color Code, as published in the CGA
 * Best Practices (Appendix B): red power, orange communication / signal, yellow gas, green sewer, blue
 * potable water, purple reclaimed water, pink survey, white proposed excavation.
 */

interface El {
  getAttribute(name: string): string | null;
  querySelectorAll(selector: string): ArrayLike<El>;
  closest(selector: string): El | null;
  tagName: string;
}
interface Doc {
  documentElement: El;
  getElementsByTagName(name: string): { length: number };
  querySelectorAll(selector: string): ArrayLike<El>;
}

let parse: (svg: string) => Doc;
beforeAll(async () => {
  const moduleName: string = 'jsdom';
  const { JSDOM } = (await import(moduleName)) as { JSDOM: new (html: string) => { window: { DOMParser: new () => { parseFromString(t: string, type: string): Doc } } } };
  const parser = new new JSDOM('').window.DOMParser();
  parse = (svg) => {
    const doc = parser.parseFromString(svg, 'image/svg+xml');
    expect(doc.getElementsByTagName('parsererror').length).toBe(0);
    return doc;
  };
}, 60_000);

const all = (root: Doc | El, selector: string): El[] => Array.from(root.querySelectorAll(selector));
const opts = { createCanvas: createNodeSvgCanvas };
const OTHER_UTILITIES = ['power', 'gas', 'sewer', 'water', 'reclaimed'] as const;

/** Every run kind: the demo job with its runs given each style in turn. */
function varied(): AsBuilt {
  const base = DEMO_AS_BUILT;
  const styles = [
    { method: 'direct_burial' },
    { method: 'conduit' },
    { method: 'under_hardscape_sleeve' },
    { method: 'indoor' },
    { method: 'direct_burial', isSpare: true },
    { method: 'direct_burial', isAbandoned: true },
  ] as const;
  return { ...base, runs: base.runs.map((run, i) => ({ ...run, ...styles[i % styles.length] })) } as AsBuilt;
}

function expectNoOtherUtilityColour(doc: Doc): void {
  for (const el of all(doc, '[stroke], [fill]')) {
    for (const attr of ['stroke', 'fill']) {
      const value = el.getAttribute(attr);
      if (value === null) continue;
      expect(OTHER_UTILITIES, `${el.tagName} ${attr}=${value}`).not.toContain(markingMeaning(value));
    }
  }
}

describe('marking palette', () => {
  it('should read the APWA colours back as their uses', () => {
    for (const [use, hex] of Object.entries(APWA_COLOURS)) expect(markingMeaning(hex)).toBe(use);
    expect(markingMeaning('#000000')).toBe('neutral');
    expect(markingMeaning('#8a8a8a')).toBe('neutral');
    // The colours the locate view used to draw runs and reference points in (issue 15): red and blue.
    expect(markingMeaning('#c0392b')).toBe('power');
    expect(markingMeaning('#3b5b8c')).toBe('water');
  });

  it('should give every run style the communication orange and tell them apart by weight and dash', () => {
    const seen = new Set<string>();
    for (const [style, spec] of Object.entries(RUN_STROKES)) {
      expect(spec.color, style).toBe(RUN_ORANGE);
      expect(markingMeaning(spec.color)).toBe('communication');
      const signature = `${spec.width}|${spec.dash ?? ''}|${spec.crossesEvery ?? ''}`;
      expect(seen.has(signature), `${style} looks like another style`).toBe(false);
      seen.add(signature);
    }
  });

  it('should name the colour of runs and the white of a dig area in no other words than the legend', () => {
    const texts = MARKING_LEGEND.map((e) => e.text.toLowerCase()).join(' ');
    for (const word of ['red', 'blue', 'yellow', 'green', 'purple', 'amber']) expect(texts).not.toMatch(new RegExp(`\\b${word}\\b`));
    expect(texts).toContain('orange');
  });
});

describe('stroke colours by role in the generated SVGs', () => {
  for (const [name, asBuilt] of [
    ['demo job', DEMO_AS_BUILT],
    ['every run style', varied()],
  ] as const) {
    it(`should draw runs orange, reference points and ties black on the site plan (${name})`, () => {
      const doc = parse(drawSitePlan(asBuilt, analyzeAsBuilt(asBuilt), opts));
      const runStrokes = all(doc, '[data-layer="runs"] [data-role="run-stroke"]');
      expect(runStrokes.length).toBeGreaterThanOrEqual(asBuilt.runs.filter((r) => r.method !== undefined).length);
      for (const el of all(doc, '[data-layer="runs"] [stroke]')) expect(el.getAttribute('stroke'), 'run stroke').toBe(RUN_ORANGE);
      const refs = all(doc, '[data-kind="reference_point"] [stroke]');
      expect(refs.length).toBeGreaterThan(0);
      for (const el of refs) expect(el.getAttribute('stroke')).toBe(REFERENCE_INK);
      for (const el of all(doc, '[data-layer="ties"] [stroke], [data-layer="ties"] [fill]')) {
        expect(markingMeaning(el.getAttribute('stroke') ?? el.getAttribute('fill')!)).toBe('neutral');
      }
      // The legend swatches of runs are orange too, and nothing anywhere is another utility's colour.
      for (const el of all(doc, '[data-legend^="run:"] [stroke]')) expect(el.getAttribute('stroke')).toBe(RUN_ORANGE);
      expectNoOtherUtilityColour(doc);
    }, 60_000);
  }

  it('should draw site features in muted grey under the runs, with their names', () => {
    const asBuilt: AsBuilt = {
      ...DEMO_AS_BUILT,
      site: { ...DEMO_AS_BUILT.site, features: DEMO_SITE_FEATURES.map((f, i) => ({ ...f, id: `feature-${i}` })) },
    };
    const svg = drawSitePlan(asBuilt, analyzeAsBuilt(asBuilt), opts);
    const doc = parse(svg);
    const features = all(doc, '[data-layer="features"] [data-kind="feature"]');
    expect(features.length).toBe(DEMO_SITE_FEATURES.length);
    for (const el of all(doc, '[data-layer="features"] [stroke], [data-layer="features"] [fill]')) {
      for (const attr of ['stroke', 'fill']) {
        const value = el.getAttribute(attr);
        if (value !== null) expect(markingMeaning(value), `${attr}=${value}`).toBe('neutral');
      }
    }
    // Under the runs: the features layer comes first in document order.
    expect(svg.indexOf('data-layer="features"')).toBeLessThan(svg.indexOf('data-layer="runs"'));
    expect(all(doc, '[data-label-kind="feature"]').map((e) => e.getAttribute('data-label-for'))).toContain('feature-0');
    expect(all(doc, '[data-legend="feature"]').length).toBe(1);
    expectNoOtherUtilityColour(doc);
  }, 60_000);

  it('should draw the schematic runs orange and nothing in another utility colour', async () => {
    const asBuilt = varied();
    const doc = parse(await drawWiringSchematic(asBuilt, analyzeAsBuilt(asBuilt), opts));
    const lines = all(doc, '[data-kind="run"] [data-role="run-stroke"]');
    expect(lines.length).toBeGreaterThan(0);
    for (const el of lines) expect(el.getAttribute('stroke')).toBe(RUN_ORANGE);
    expectNoOtherUtilityColour(doc);
  }, 60_000);

  it('should draw the depth profile cable orange and shallow readings black', () => {
    const analysis = analyzeAsBuilt(DEMO_AS_BUILT);
    const doc = parse(drawDepthProfile(DEMO_AS_BUILT, analysis, 'run-p2', opts));
    const profile = all(doc, '[data-role="profile"]');
    expect(profile.length).toBe(1);
    expect(profile[0]!.getAttribute('stroke')).toBe(RUN_ORANGE);
    const shallow = all(doc, '[data-shallow="true"]');
    expect(shallow.length).toBeGreaterThan(0);
    for (const el of shallow) expect(markingMeaning(el.getAttribute('fill')!)).toBe('neutral');
    expectNoOtherUtilityColour(doc);
  });
});

describe(runStyleKey.name, () => {
  // Issue 21: indoor runs are drawn as indoor, never as buried — the spare and abandoned lines mean
  // cable in the ground ('Abandoned run, still buried' in the legend).
  it.each([
    [{ method: 'direct_burial' as const }, 'direct_burial'],
    [{ method: 'conduit' as const, isSpare: true }, 'spare'],
    [{ method: 'direct_burial' as const, isSpare: true, isAbandoned: true }, 'abandoned'],
    [{ method: 'indoor' as const }, 'indoor'],
    [{ method: 'indoor' as const, isSpare: true }, 'indoor'],
    [{ method: 'indoor' as const, isAbandoned: true }, 'indoor'],
  ])('%o is drawn as %s', (run, style) => {
    expect(runStyleKey(run)).toBe(style);
  });
});

describe('legend words spelled for the locale (issue 16)', () => {
  // Spellings: Merriam-Webster (American "color", "gray") and the Oxford English Dictionary (British "colour", "grey").
  it.each([
    [undefined, 'APWA uniform color code', '(gray)'],
    ['en-US', 'APWA uniform color code', '(gray)'],
    ['es-US', 'APWA uniform color code', '(gray)'],
    ['en-GB', 'APWA uniform colour code', '(grey)'],
    ['en-AU', 'APWA uniform colour code', '(grey)'],
  ] as const)('should write the colour sentence and the feature entry in %s with "%s" and "%s"', (locale, code, gray) => {
    expect(colourKeyNote(locale)).toContain(code);
    expect(legendText('feature', locale)).toContain(gray);
    // No placeholder is ever left in the words.
    for (const { key } of MARKING_LEGEND) expect(legendText(key, locale)).not.toMatch(/[{}]/);
    expect(colourKeyNote(locale)).not.toMatch(/[{}]/);
  });
});
