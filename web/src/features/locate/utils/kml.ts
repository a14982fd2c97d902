import type { SiteMapGeoJson } from '@domain/locate/site-map.schema';

function escapeXml(text: string): string {
  return text.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;').replace(/'/g, '&apos;');
}

const coord = ([lon, lat]: readonly [number, number]) => `${lon.toFixed(8)},${lat.toFixed(8)}`;

/**
 * The map's GeoJSON (WGS 84, [lon, lat]) as a KML 2.2 document (OGC 07-147r2: `coordinates` are
 * "lon,lat[,alt]" tuples separated by spaces), one Placemark per run (LineString) and item (Point);
 * features without a geometry are left out.
 */
export function geoJsonToKml(geojson: SiteMapGeoJson, documentName: string): string {
  const placemarks = geojson.features.flatMap((f) => {
    if (!f.geometry) return [];
    const label = typeof f.properties.label === 'string' ? f.properties.label : f.id;
    const geometry =
      f.geometry.type === 'Point'
        ? `<Point><coordinates>${coord(f.geometry.coordinates)}</coordinates></Point>`
        : `<LineString><tessellate>1</tessellate><coordinates>${f.geometry.coordinates.map(coord).join(' ')}</coordinates></LineString>`;
    return [`    <Placemark id="${escapeXml(f.id)}"><name>${escapeXml(label)}</name>${geometry}</Placemark>`];
  });
  return [
    '<?xml version="1.0" encoding="UTF-8"?>',
    '<kml xmlns="http://www.opengis.net/kml/2.2">',
    '  <Document>',
    `    <name>${escapeXml(documentName)}</name>`,
    ...placemarks,
    '  </Document>',
    '</kml>',
    '',
  ].join('\n');
}

/** A file name from the site's label: `wrenfold-close-buried-cables.kml`. */
export function kmlFileName(siteLabel: string): string {
  const slug = siteLabel.replace(/[^A-Za-z0-9]+/g, '-').replace(/^-|-$/g, '').toLowerCase() || 'site';
  return `${slug}-buried-cables.kml`;
}
