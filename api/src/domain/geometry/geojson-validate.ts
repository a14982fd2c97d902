/**
 * A structural RFC 7946 checker for what we emit and what we may import: returns a list of problems
 * (empty = valid). Covers §1.4 case-sensitive types, §3 `type` member, §3.1.1 positions (≥ 2 numbers),
 * §3.1.4 LineString ≥ 2 positions, §3.1.6 linear rings (closed, ≥ 4 positions; winding is NOT
 * checked: parsers should not reject it), §3.2 Feature `geometry`/`properties` members and `id`
 * type, §3.3 `features` array, §5 bbox length 2·n, §7.1 no `coordinates`/`geometries` on features.
 * Latitude outside ±90° is reported too (almost always swapped lon/lat), though not an RFC rule.
 */
export function validateGeoJson(value: unknown, path = '$'): string[] {
  const problems: string[] = [];
  check(value, path, problems);
  return problems;
}

const GEOMETRY_TYPES = ['Point', 'MultiPoint', 'LineString', 'MultiLineString', 'Polygon', 'MultiPolygon', 'GeometryCollection'];

function isObject(v: unknown): v is Record<string, unknown> {
  return typeof v === 'object' && v !== null && !Array.isArray(v);
}

function checkPosition(p: unknown, path: string, problems: string[]): void {
  if (!Array.isArray(p) || p.length < 2 || !p.every((n) => typeof n === 'number' && Number.isFinite(n))) {
    problems.push(`${path}: a position is an array of two or more numbers (RFC 7946 §3.1.1)`);
    return;
  }
  const lat = p[1] as number;
  if (lat < -90 || lat > 90) problems.push(`${path}: latitude ${lat} is out of range — longitude and latitude swapped?`);
}

function checkPositions(list: unknown, min: number, path: string, problems: string[], what: string): void {
  if (!Array.isArray(list) || list.length < min) {
    problems.push(`${path}: ${what} needs ${min} or more positions`);
    return;
  }
  list.forEach((p, i) => checkPosition(p, `${path}[${i}]`, problems));
}

function checkRing(ring: unknown, path: string, problems: string[]): void {
  checkPositions(ring, 4, path, problems, 'a linear ring (RFC 7946 §3.1.6)');
  if (Array.isArray(ring) && ring.length >= 4) {
    const first = ring[0] as unknown[];
    const last = ring[ring.length - 1] as unknown[];
    if (!Array.isArray(first) || !Array.isArray(last) || first.length !== last.length || first.some((v, i) => v !== last[i])) {
      problems.push(`${path}: a linear ring's first and last positions must be identical (RFC 7946 §3.1.6)`);
    }
  }
}

function checkBbox(obj: Record<string, unknown>, path: string, problems: string[]): void {
  if (!('bbox' in obj)) return;
  const bbox = obj['bbox'];
  if (!Array.isArray(bbox) || bbox.length < 4 || bbox.length % 2 !== 0 || !bbox.every((n) => typeof n === 'number')) {
    problems.push(`${path}.bbox: must hold 2·n numbers (RFC 7946 §5)`);
  }
}

function checkGeometry(g: Record<string, unknown>, path: string, problems: string[]): void {
  const type = g['type'];
  const coords = g['coordinates'];
  switch (type) {
    case 'Point':
      checkPosition(coords, `${path}.coordinates`, problems);
      break;
    case 'MultiPoint':
      checkPositions(coords, 0, `${path}.coordinates`, problems, 'a MultiPoint');
      break;
    case 'LineString':
      checkPositions(coords, 2, `${path}.coordinates`, problems, 'a LineString (RFC 7946 §3.1.4)');
      break;
    case 'MultiLineString':
      if (!Array.isArray(coords)) problems.push(`${path}.coordinates: must be an array`);
      else coords.forEach((l, i) => checkPositions(l, 2, `${path}.coordinates[${i}]`, problems, 'a LineString'));
      break;
    case 'Polygon':
      if (!Array.isArray(coords)) problems.push(`${path}.coordinates: must be an array of rings`);
      else coords.forEach((r, i) => checkRing(r, `${path}.coordinates[${i}]`, problems));
      break;
    case 'MultiPolygon':
      if (!Array.isArray(coords)) problems.push(`${path}.coordinates: must be an array of polygons`);
      else
        coords.forEach((poly, i) => {
          if (!Array.isArray(poly)) problems.push(`${path}.coordinates[${i}]: must be an array of rings`);
          else poly.forEach((r, j) => checkRing(r, `${path}.coordinates[${i}][${j}]`, problems));
        });
      break;
    case 'GeometryCollection': {
      const geoms = g['geometries'];
      if (!Array.isArray(geoms)) problems.push(`${path}.geometries: a GeometryCollection has a "geometries" array`);
      else geoms.forEach((child, i) => check(child, `${path}.geometries[${i}]`, problems));
      break;
    }
  }
}

function check(value: unknown, path: string, problems: string[]): void {
  if (!isObject(value)) {
    problems.push(`${path}: a GeoJSON object must be a JSON object`);
    return;
  }
  const type = value['type'];
  if (typeof type !== 'string') {
    problems.push(`${path}: missing "type" member (RFC 7946 §3)`);
    return;
  }
  checkBbox(value, path, problems);
  if (type === 'Feature') {
    if ('coordinates' in value || 'geometries' in value || 'features' in value) {
      problems.push(`${path}: a Feature must not have "coordinates", "geometries" or "features" (RFC 7946 §7.1)`);
    }
    if (!('geometry' in value)) problems.push(`${path}: a Feature has a "geometry" member (RFC 7946 §3.2)`);
    else if (value['geometry'] !== null) {
      const g = value['geometry'];
      if (!isObject(g) || typeof g['type'] !== 'string' || !GEOMETRY_TYPES.includes(g['type'])) {
        problems.push(`${path}.geometry: must be a geometry object or null`);
      } else check(g, `${path}.geometry`, problems);
    }
    if (!('properties' in value)) problems.push(`${path}: a Feature has a "properties" member (RFC 7946 §3.2)`);
    else if (value['properties'] !== null && !isObject(value['properties'])) {
      problems.push(`${path}.properties: must be an object or null`);
    }
    if ('id' in value && typeof value['id'] !== 'string' && typeof value['id'] !== 'number') {
      problems.push(`${path}.id: must be a string or a number (RFC 7946 §3.2)`);
    }
    return;
  }
  if (type === 'FeatureCollection') {
    if ('coordinates' in value || 'geometries' in value) {
      problems.push(`${path}: a FeatureCollection must not have "coordinates" or "geometries" (RFC 7946 §7.1)`);
    }
    const features = value['features'];
    if (!Array.isArray(features)) problems.push(`${path}: a FeatureCollection has a "features" array (RFC 7946 §3.3)`);
    else features.forEach((f, i) => {
      if (!isObject(f) || f['type'] !== 'Feature') problems.push(`${path}.features[${i}]: must be a Feature`);
      else check(f, `${path}.features[${i}]`, problems);
    });
    return;
  }
  if (!GEOMETRY_TYPES.includes(type)) {
    problems.push(`${path}: unknown type "${type}" (types are case-sensitive, RFC 7946 §1.4)`);
    return;
  }
  checkGeometry(value, path, problems);
}
