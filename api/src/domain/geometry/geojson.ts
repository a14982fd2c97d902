import type { PlanPoint } from '../as-built/common.schema.js';
import { planToWgs84, type LocalFrame } from './local-tangent-plane.js';

/** RFC 7946 position: [longitude, latitude] in decimal degrees (WGS 84 / OGC CRS84). */
export type GeoJsonPosition = [number, number];
export type GeoJsonPoint = { type: 'Point'; coordinates: GeoJsonPosition };
export type GeoJsonLineString = { type: 'LineString'; coordinates: GeoJsonPosition[] };
export type GeoJsonProperties = Record<string, string | number | boolean | null | string[]>;
export interface GeoJsonFeature<G = GeoJsonPoint | GeoJsonLineString> {
  type: 'Feature';
  id: string;
  /** null = unlocated (RFC 7946 §3.2). */
  geometry: G | null;
  properties: GeoJsonProperties;
}
export interface GeoJsonFeatureCollection {
  type: 'FeatureCollection';
  features: GeoJsonFeature[];
}

/** 7 decimal places of a degree ≈ 1 cm: finer than any tape, coarser than float noise. */
export const GEOJSON_DECIMALS = 7;

function round(value: number): number {
  const f = 10 ** GEOJSON_DECIMALS;
  return Math.round(value * f) / f;
}

/** Plan point → RFC 7946 position [lon, lat], rounded to 7 decimals. */
export function planToPosition(frame: LocalFrame, p: PlanPoint): GeoJsonPosition {
  const g = planToWgs84(frame, p);
  return [round(g.lon), round(g.lat)];
}

export interface GeoJsonItemInput {
  id: string;
  position: PlanPoint | null;
  properties: GeoJsonProperties;
}

export interface GeoJsonRunInput {
  id: string;
  /** Plan polyline (≥ 2 points) or null when the run's route is unknown. */
  route: readonly PlanPoint[] | null;
  properties: GeoJsonProperties;
}

/**
 * RFC 7946 FeatureCollection: each run a LineString feature, each item a Point feature, in
 * [lon, lat] order, no `crs` member, coordinates rounded to 7 decimals; unlocated features carry
 * `geometry: null`. Runs come first so that items draw on top in most viewers.
 */
export function buildFeatureCollection(
  frame: LocalFrame,
  runs: readonly GeoJsonRunInput[],
  items: readonly GeoJsonItemInput[],
): GeoJsonFeatureCollection {
  const features: GeoJsonFeature[] = [];
  for (const run of runs) {
    features.push({
      type: 'Feature',
      id: run.id,
      geometry:
        run.route !== null && run.route.length >= 2
          ? { type: 'LineString', coordinates: run.route.map((p) => planToPosition(frame, p)) }
          : null,
      properties: run.properties,
    });
  }
  for (const item of items) {
    features.push({
      type: 'Feature',
      id: item.id,
      geometry: item.position === null ? null : { type: 'Point', coordinates: planToPosition(frame, item.position) },
      properties: item.properties,
    });
  }
  return { type: 'FeatureCollection', features };
}
