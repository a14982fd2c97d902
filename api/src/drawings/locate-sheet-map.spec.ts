import { describe, expect, it } from 'vitest';

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

describe('drawLocateSheetMap', () => {
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
