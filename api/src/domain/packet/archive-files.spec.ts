import { describe, expect, it } from 'vitest';

import { DEMO_AS_BUILT } from '../as-built/demo-as-built.js';
import { featureCollectionToKml } from '../geometry/kml.js';
import { archiveReadme } from './archive-readme.js';
import { cableScheduleCsv } from './cable-schedule-csv.js';
import { demoPacketSnapshot } from './demo-packet-snapshot.js';
import type { PacketSnapshot } from './packet-snapshot.js';

const withUnits = (units: 'imperial' | 'metric'): PacketSnapshot => {
  const snapshot = demoPacketSnapshot();
  return { ...snapshot, settings: { ...snapshot.settings, units } };
};

/** The cells of one CSV line (RFC 4180 quoting). */
const csvCells = (line: string, count: number) => [...line.matchAll(/("(?:[^"]|"")*"|[^,]*)(?:,|$)/g)].map((m) => m[1]!).slice(0, count);

/** `26 ft 3 in` / `40 ft` → inches; `4 3/8 in` / `3/4 in` / `18 in` → inches. */
function inchesOf(text: string): number {
  const feetInches = /^(\d+) ft(?: (\d+) in)?$/.exec(text);
  if (feetInches) return Number(feetInches[1]) * 12 + Number(feetInches[2] ?? 0);
  if (!/^\d+( \d\/\d)? in$|^\d\/\d in$/.test(text)) throw new Error(`not feet-inches or inches: ${text}`);
  return text
    .slice(0, -3)
    .split(' ')
    .reduce((sum, part) => {
      const [num, den] = part.split('/');
      return sum + Number(num) / Number(den ?? 1);
    }, 0);
}

describe('cable schedule CSV in both unit systems', () => {
  it('should add feet and inches columns after the SI ones for an imperial company', () => {
    const [header, first] = cableScheduleCsv(withUnits('imperial')).split('\r\n');
    const columns = header!.split(',');
    expect(columns.slice(0, 14)).toEqual(cableScheduleCsv(withUnits('metric')).split('\r\n')[0]!.split(',').slice(0, 14));
    expect(columns.slice(14)).toEqual(['length_ft', 'min_depth_in', 'max_depth_in', 'length_text', 'min_depth_text', 'max_depth_text']);
    // 1 ft = 0.3048 m, 1 in = 0.0254 m exactly (NIST SP 811, appendix B.8): each row's imperial cells
    // are its SI cells converted.
    const cells = csvCells(first!, columns.length);
    const lengthM = Number(cells[columns.indexOf('length_m')]);
    expect(lengthM).toBeGreaterThan(0);
    expect(Number(cells[columns.indexOf('length_ft')])).toBeCloseTo(lengthM / 0.3048, 1);
    const minDepthM = Number(cells[columns.indexOf('min_depth_m')]);
    if (cells[columns.indexOf('min_depth_m')] !== '') expect(Number(cells[columns.indexOf('min_depth_in')])).toBeCloseTo(minDepthM / 0.0254, 1);
  });

  it('should write the length and depths of each run as the packet does, in the company units, next to the numbers', () => {
    for (const units of ['imperial', 'metric'] as const) {
      const [header, ...rows] = cableScheduleCsv(withUnits(units)).split('\r\n').filter((line) => line !== '');
      const columns = header!.split(',');
      expect(columns.slice(-3), units).toEqual(['length_text', 'min_depth_text', 'max_depth_text']);
      let depthsSeen = 0;
      for (const row of rows) {
        const cells = csvCells(row, columns.length);
        const cell = (name: string) => cells[columns.indexOf(name)]!;
        const lengthM = Number(cell('length_m'));
        if (units === 'imperial') {
          // Feet and whole inches (`26 ft 3 in`), within half an inch of the metres (1 in = 0.0254 m, NIST SP 811 B.8).
          expect(cell('length_text')).toMatch(/^\d+ ft( \d{1,2} in)?$/);
          expect(Math.abs(inchesOf(cell('length_text')) - lengthM / 0.0254)).toBeLessThanOrEqual(0.5 + 0.04);
        } else {
          expect(cell('length_text')).toBe(`${Number(lengthM.toFixed(2))} m`);
        }
        for (const [text, metres] of [['min_depth_text', 'min_depth_m'], ['max_depth_text', 'max_depth_m']] as const) {
          if (cell(metres) === '') {
            expect(cell(text)).toBe('');
            continue;
          }
          depthsSeen += 1;
          const depthM = Number(cell(metres));
          if (units === 'imperial') {
            // Nearest 1/8 in (common practice on a tape; issue 16 asks for eighths).
            expect(Math.abs(inchesOf(cell(text)) - depthM / 0.0254)).toBeLessThanOrEqual(1 / 16 + 0.01);
          } else {
            expect(cell(text)).toBe(`${Number((depthM * 100).toFixed(1))} cm`);
          }
        }
      }
      expect(depthsSeen, units).toBeGreaterThan(0);
    }
  });

  it('should keep a metric company to SI columns', () => {
    expect(cableScheduleCsv(withUnits('metric')).split('\r\n')[0]).not.toMatch(/_ft|_in\b/);
  });
});

describe('archive read-me', () => {
  it('should name every file, the units and the coordinate systems', () => {
    const snapshot = withUnits('imperial');
    const text = archiveReadme({ snapshot, pdfName: 'yard-job-rev-1.pdf', hasGeoJson: true, photoCount: 2 });
    for (const name of ['yard-job-rev-1.pdf', 'site-plan.svg', 'wiring-schematic.svg', 'cable-schedule.csv', 'as-built.json', 'runs-and-items.geojson', 'runs-and-items.kml', 'photos/', 'MANIFEST.sha256']) {
      expect(text, name).toContain(name);
    }
    expect(text).toContain('feet and inches');
    expect(text).toContain('plan metres');
    expect(text).toContain('WGS 84');
    expect(text).toContain('811');
  });

  it('should say there are no map files when the site has no origin', () => {
    const text = archiveReadme({ snapshot: withUnits('metric'), pdfName: 'p.pdf', hasGeoJson: false, photoCount: 0 });
    expect(text).not.toContain('runs-and-items.kml');
    expect(text).not.toContain('photos/');
    expect(text).toContain('no WGS 84 origin');
  });
});

describe(featureCollectionToKml.name, () => {
  it('should write one placemark per positioned feature, runs orange, names escaped', () => {
    const kml = featureCollectionToKml(
      {
        type: 'FeatureCollection',
        features: [
          { type: 'Feature', id: 'r1', geometry: { type: 'LineString', coordinates: [[-90.1, 40.1], [-90.2, 40.2]] }, properties: { label: 'Patio <splice> & P1', isSpare: false } },
          { type: 'Feature', id: 'i1', geometry: { type: 'Point', coordinates: [-90.1, 40.1] }, properties: { label: 'Amp', model: null } },
          { type: 'Feature', id: 'i2', geometry: null, properties: { label: 'Unplaced' } },
        ],
      } as never,
      DEMO_AS_BUILT.site?.origin ? 'Demo yard' : 'Demo',
    );
    expect(kml.match(/<Placemark>/g)).toHaveLength(2);
    expect(kml).toContain('<name>Patio &lt;splice&gt; &amp; P1</name>');
    expect(kml).toContain('<coordinates>-90.1,40.1 -90.2,40.2</coordinates>');
    // #d35400 (the palette's orange) in KML's aabbggrr order.
    expect(kml).toContain('<color>ff0054d3</color>');
    expect(kml).not.toContain('Unplaced');
  });
});
