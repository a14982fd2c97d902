import { describe, expect, it } from 'vitest';

import { geoJsonToKml, kmlFileName } from './kml';

describe('geoJsonToKml', () => {
  it('should write runs as LineStrings and items as Points in lon,lat order (OGC KML 2.2, 07-147r2 §16.9), escaping names', () => {
    const kml = geoJsonToKml(
      {
        type: 'FeatureCollection',
        features: [
          { type: 'Feature', id: 'run-1', geometry: { type: 'LineString', coordinates: [[-105.1, 40.2], [-105.2, 40.3]] }, properties: { label: 'Run <A> & B' } },
          { type: 'Feature', id: 'spk-1', geometry: { type: 'Point', coordinates: [-105.1, 40.2] }, properties: { label: 'Speaker L' } },
          { type: 'Feature', id: 'x', geometry: null, properties: {} },
        ],
      },
      'Wrenfold Close',
    );
    expect(kml).toContain('<kml xmlns="http://www.opengis.net/kml/2.2">');
    expect(kml).toContain('<name>Wrenfold Close</name>');
    expect(kml).toContain('<name>Run &lt;A&gt; &amp; B</name><LineString><tessellate>1</tessellate><coordinates>-105.10000000,40.20000000 -105.20000000,40.30000000</coordinates>');
    expect(kml).toContain('<Point><coordinates>-105.10000000,40.20000000</coordinates></Point>');
    expect(kml.match(/<Placemark/g)).toHaveLength(2);
    const doc = new DOMParser().parseFromString(kml, 'application/xml');
    expect(doc.getElementsByTagName('parsererror')).toHaveLength(0);
    expect(kmlFileName('Wrenfold Close #2')).toBe('wrenfold-close-2-buried-cables.kml');
  });
});
