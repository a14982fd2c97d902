import { describe, expect, it } from 'vitest';

import { analyzeAsBuilt } from '../domain/analysis/analyze.js';
import type { AsBuilt } from '../domain/as-built/as-built.schema.js';
import { DEMO_AS_BUILT } from '../domain/as-built/demo-as-built.js';
import { generateSyntheticAsBuilt } from '../domain/as-built/synthetic-as-built.js';
import { buildSiteMap } from '../domain/locate/site-map.js';
import type { SiteMap } from '../domain/locate/site-map.schema.js';
import { drawLocateSheetMap, sheetRunLabel } from './locate-sheet-map.js';
import { markingMeaning, RUN_ORANGE } from './marking-palette.js';

const from = { revisionId: '00000000-0000-4000-8000-000000000101', revision: 1, jobId: '00000000-0000-4000-8000-000000000201', jobTitle: 'Backyard audio' };

function siteMap(overrides: Partial<SiteMap> = {}): SiteMap {
  return {
    frame: { northAzimuthDeg: 20, origin: null },
    revisions: [],
    referencePoints: [{ id: 'rp', label: 'Porch post', x: 0, y: 0 }],
    siteFeatures: [{ id: 'f', kind: 'fence', name: 'East fence', shape: 'line', points: [{ x: 12, y: -2 }, { x: 12, y: 10 }] }],
    items: [
      { ...from, id: 'a', kind: 'wall_entry', label: 'Garage wall', position: { x: 1, y: 1, source: 'ties', accuracyM: 0.05 }, ties: [{ referencePointId: 'rp', distanceM: Math.SQRT2 }], wallEntry: null, isCapped: null },
      { ...from, id: 'b', kind: 'speaker', label: 'Rock speaker', position: { x: 10, y: 8, source: 'ties', accuracyM: 0.05 }, ties: [{ referencePointId: 'rp', distanceM: Math.hypot(10, 8) }], wallEntry: null, isCapped: null },
    ],
    runs: [
      {
        ...from,
        id: 'r1',
        label: 'Lawn run',
        fromItemId: 'a',
        toItemId: 'b',
        cableType: 'CL2',
        gauge: '14 AWG',
        conductors: 2,
        method: 'direct_burial',
        location: '',
        measuredLengthM: 12,
        minDepthM: 0.1016,
        maxDepthM: 0.2,
        depthReadings: [],
        minCoverM: 0.1524,
        isShallow: true,
        route: [{ x: 1, y: 1 }, { x: 10, y: 8 }],
        isRouteDrawn: true,
        isSpare: false,
        isAbandoned: false,
      },
    ],
    geojson: null,
    ...overrides,
  };
}

function mapOf(asBuilt: AsBuilt): SiteMap {
  return buildSiteMap([{ ...from, issuedAt: '2026-05-14T17:00:00.000Z', asBuilt, analysis: analyzeAsBuilt(asBuilt) }]);
}

type Pt = { x: number; y: number };

/**
 * Each drawn label with the runs (other than its own) whose drawn line passes through its box, found by
 * walking every segment of the SVG's polylines in 0.25 pt steps (independent of the placer's own test).
 */
function labelsAcrossRuns(svg: string): { labels: number; across: string[] } {
  const runs = [...svg.matchAll(/<polyline data-run-id="([^"]+)" points="([^"]+)"/g)].map((m) => ({
    id: m[1]!,
    points: m[2]!.split(' ').map((p): Pt => ({ x: Number(p.split(',')[0]), y: Number(p.split(',')[1]) })),
  }));
  const labels = [...svg.matchAll(/<text data-label="([^"]+)" data-box="([^"]+)"/g)].map((m) => {
    const [x, y, width, height] = m[2]!.split(' ').map(Number) as [number, number, number, number];
    return { id: m[1]!, box: { x, y, width, height } };
  });
  const inside = (p: Pt, b: { x: number; y: number; width: number; height: number }) => p.x >= b.x && p.x <= b.x + b.width && p.y >= b.y && p.y <= b.y + b.height;
  const across = labels.flatMap((label) =>
    runs
      .filter((run) => label.id !== `run:${run.id}`)
      // Runs wholly to one side of the box cannot touch it (a cheap first look: the crowded job has hundreds).
      .filter((run) => !run.points.every((p) => p.x < label.box.x) && !run.points.every((p) => p.x > label.box.x + label.box.width))
      .filter((run) => !run.points.every((p) => p.y < label.box.y) && !run.points.every((p) => p.y > label.box.y + label.box.height))
      .filter((run) =>
        run.points.slice(1).some((b, i) => {
          const a = run.points[i]!;
          const steps = Math.max(1, Math.ceil(Math.hypot(b.x - a.x, b.y - a.y) / 0.25));
          return Array.from({ length: steps + 1 }, (_, j) => ({ x: a.x + ((b.x - a.x) * j) / steps, y: a.y + ((b.y - a.y) * j) / steps })).some((p) => inside(p, label.box));
        }),
      )
      .map((run) => `${label.id} across ${run.id}`),
  );
  return { labels: labels.length, across };
}

describe('drawLocateSheetMap', () => {
  it('should lay no label across a run it does not name on the demo job, every label placed', () => {
    const map = mapOf(DEMO_AS_BUILT);
    const svg = drawLocateSheetMap(map, { widthPt: 547, heightPt: 400, units: 'imperial' });
    const { labels, across } = labelsAcrossRuns(svg);
    // Before the runs were obstacles, ten labels lay across other runs near the splices.
    expect(across).toEqual([]);
    // Every run, item, reference point and tie keeps its label (11 + 13 + 3 + 25).
    const ties = map.items.reduce((sum, item) => sum + item.ties.length, 0);
    expect(labels).toBe(map.runs.length + map.items.length + map.referencePoints.length + ties + map.siteFeatures.length);
    expect(labels).toBe(52);
    expect(svg).not.toContain('data-role="labels-left-off"');
  });

  it('should lay no label across another run on a crowded job, and count the labels it leaves off', () => {
    const svg = drawLocateSheetMap(mapOf(generateSyntheticAsBuilt(7)), { widthPt: 547, heightPt: 400, units: 'metric' });
    const { labels, across } = labelsAcrossRuns(svg);
    expect(labels).toBeGreaterThan(50);
    expect(across).toEqual([]);
    expect(svg).toMatch(/data-role="labels-left-off"[^>]*>\d+ labels left off: no spot clear of the other runs and labels\.</);
    // 500 items and their runs: a few seconds on a quiet machine.
  }, 60_000);

  it('should draw runs orange only, ties with distances in the viewer’s units, a scale bar and a north arrow', () => {
    const svg = drawLocateSheetMap(siteMap(), { widthPt: 540, heightPt: 400, units: 'imperial' });
    // APWA uniform colour code (CGA Best Practices, Appendix B): signal cable is orange; no other utility colour.
    const colours = [...svg.matchAll(/(?:stroke|fill)="(#[0-9a-f]{6})"/gi)].map((m) => m[1]!.toLowerCase());
    expect(colours).toContain(RUN_ORANGE);
    expect(colours.map((c) => markingMeaning(c)).filter((m) => m !== 'neutral' && m !== 'communication' && m !== 'proposedExcavation')).toEqual([]);
    expect(svg).toContain('data-run-id="r1"');
    // 1.414 m = 4 ft 8 in; 12.81 m = 42 ft 0 in (ties in feet and inches, 'long').
    expect(svg).toMatch(/>4 ft 8 in</);
    expect(svg).toContain('Lawn run: min 4 in (SHALLOW)');
    expect(svg).toMatch(/data-role="scale-label">\d+ ft</);
    expect(svg).toContain('rotate(-20)');
  });

  it('should say so when nothing has a position (no features, no ties, no runs), and draw no ties without any', () => {
    const empty = drawLocateSheetMap(siteMap({ referencePoints: [], siteFeatures: [], items: [], runs: [] }), { widthPt: 540, heightPt: 400, units: 'metric' });
    expect(empty).toContain('Nothing on this site has a position on the plan yet.');
    const untied = siteMap({ siteFeatures: [] });
    untied.items = untied.items.map((i) => ({ ...i, ties: [] }));
    const svg = drawLocateSheetMap(untied, { widthPt: 540, heightPt: 400, units: 'metric' });
    expect(svg).toContain('<g data-layer="ties"></g>');
    expect(svg).toContain('<g data-layer="features"></g>');
    expect(svg).toMatch(/data-role="scale-label">\d+ m</);
  });

  it('should escape names', () => {
    expect(sheetRunLabel({ label: 'A <b> & "c"', minDepthM: null, isShallow: false, isAbandoned: true }, 'metric')).toBe('A <b> & "c": depth not recorded (abandoned)');
    const svg = drawLocateSheetMap(siteMap({ runs: [{ ...siteMap().runs[0]!, label: '<script>' }] }), { widthPt: 540, heightPt: 400, units: 'metric' });
    expect(svg).not.toContain('<script>');
    expect(svg).toContain('&lt;script&gt;');
  });
});
