import { readFileSync } from 'node:fs';

import { describe, expect, it } from 'vitest';

import { buildFeatureCollection } from './geojson.js';
import { validateGeoJson } from './geojson-validate.js';
import { createLocalFrame } from './local-tangent-plane.js';

interface GeoJsonFixture {
  source: string;
  valid: { name: string; obj: unknown }[];
  invalid: { name: string; obj: unknown; why: string }[];
  warnings_only: { name: string; obj: unknown }[];
}

const fixtures = JSON.parse(
  readFileSync(new URL('../../../../test/fixtures/reference/geojson_fixtures.json', import.meta.url), 'utf8'),
) as GeoJsonFixture;

describe(validateGeoJson.name, () => {
  // RFC 7946 valid examples (incl. Appendix A.1 point, null geometry, antimeridian bbox).
  it.each(fixtures.valid.map((f) => [f.name, f.obj] as const))('should accept %s', (_name, obj) => {
    expect(validateGeoJson(obj)).toEqual([]);
  });

  // RFC 7946 violations, each with the section it breaks (plus the swapped lon/lat range check).
  it.each(fixtures.invalid.map((f) => [f.name, f.obj, f.why] as const))('should reject %s (%s)', (_name, obj) => {
    expect(validateGeoJson(obj).length).toBeGreaterThan(0);
  });

  // RFC 7946 §3.1.6 / §3.1.1 / App. B: parsers SHOULD NOT reject these.
  it.each(fixtures.warnings_only.map((f) => [f.name, f.obj] as const))('should not reject %s', (_name, obj) => {
    expect(validateGeoJson(obj)).toEqual([]);
  });
});

describe(buildFeatureCollection.name, () => {
  const frame = createLocalFrame({ lat: 40, lon: -105 });
  const sut = buildFeatureCollection(
    frame,
    [
      { id: 'run-1', route: [{ x: 0, y: 0 }, { x: 30, y: 44.4 }], properties: { awg: 14 } },
      { id: 'run-2', route: null, properties: {} },
    ],
    [{ id: 'sp-1', position: { x: 30, y: 44.4 }, properties: { kind: 'speaker' } }],
  );

  it('should build a valid FeatureCollection with unlocated features as null geometry', () => {
    expect(validateGeoJson(sut)).toEqual([]);
    expect(sut.features.map((f) => f.geometry?.type ?? null)).toEqual(['LineString', null, 'Point']);
  });

  it('should write [longitude, latitude] rounded to 7 decimals', () => {
    const coords = sut.features[2]!.geometry!.coordinates as [number, number];
    expect(coords[0]).toBeCloseTo(-104.99964869, 6); // the RFC fixture's buried-run endpoint, 30 m E / 44.4 m N
    expect(coords[1]).toBeCloseTo(40.0004, 6);
    for (const v of coords) expect(Math.abs(v * 1e7 - Math.round(v * 1e7))).toBeLessThan(1e-6);
  });
});
