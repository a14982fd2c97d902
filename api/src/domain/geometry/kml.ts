import type { GeoJsonFeatureCollection, GeoJsonProperties } from './geojson.js';

const escapeXml = (text: string) =>
  text.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&apos;' })[c]!);

/** A coordinate tuple in KML order (longitude,latitude), as in the GeoJSON it comes from. */
const coordinate = ([lon, lat]: readonly [number, number]) => `${lon},${lat}`;

function extendedData(properties: GeoJsonProperties): string {
  const rows = Object.entries(properties)
    .filter(([, value]) => value !== null)
    .map(([key, value]) => `<Data name="${escapeXml(key)}"><value>${escapeXml(Array.isArray(value) ? value.join(', ') : String(value))}</value></Data>`);
  return rows.length > 0 ? `<ExtendedData>${rows.join('')}</ExtendedData>` : '';
}

/**
 * KML 2.2 (OGC 07-147r2) of the runs and items GeoJSON, for mapping programs that read KML rather than
 * GeoJSON. Both are WGS 84 longitude/latitude; runs are drawn orange (the APWA uniform colour code's
 * colour for communication and signal cable; KML colours are aabbggrr), features without a position are
 * left out. Properties travel as ExtendedData.
 */
export function featureCollectionToKml(collection: GeoJsonFeatureCollection, name: string): string {
  const placemarks = collection.features
    .filter((f) => f.geometry !== null)
    .map((f) => {
      const label = typeof f.properties.label === 'string' ? f.properties.label : String(f.id ?? '');
      const geometry =
        f.geometry!.type === 'Point'
          ? `<Point><coordinates>${coordinate(f.geometry!.coordinates)}</coordinates></Point>`
          : `<LineString><tessellate>1</tessellate><coordinates>${f.geometry!.coordinates.map(coordinate).join(' ')}</coordinates></LineString>`;
      const style = f.geometry!.type === 'LineString' ? '<styleUrl>#run</styleUrl>' : '<styleUrl>#item</styleUrl>';
      return `    <Placemark><name>${escapeXml(label)}</name>${style}${extendedData(f.properties)}${geometry}</Placemark>`;
    });
  return [
    '<?xml version="1.0" encoding="UTF-8"?>',
    '<kml xmlns="http://www.opengis.net/kml/2.2">',
    '  <Document>',
    `    <name>${escapeXml(name)}</name>`,
    '    <Style id="run"><LineStyle><color>ff0054d3</color><width>3</width></LineStyle></Style>',
    '    <Style id="item"><IconStyle><color>ff000000</color></IconStyle></Style>',
    ...placemarks,
    '  </Document>',
    '</kml>',
    '',
  ].join('\n');
}
