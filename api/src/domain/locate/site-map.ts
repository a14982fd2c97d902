import type { AsBuiltAnalysis } from '../analysis/analyze.js';
import type { AsBuilt } from '../as-built/as-built.schema.js';
import type { SiteRecordInfo } from '../jobs/job.schema.js';
import type { PlanPoint } from '../as-built/common.schema.js';
import { formatGauge } from '../cable/wire.js';
import { buildFeatureCollection, type GeoJsonFeature, type GeoJsonItemInput, type GeoJsonRunInput } from '../geometry/geojson.js';
import { createLocalFrame } from '../geometry/local-tangent-plane.js';
import type { SiteMap, SiteMapGeoJson, SiteMapItem, SiteMapRun } from './site-map.schema.js';

/** One issued revision's frozen record, as the map needs it. */
export interface SiteMapSource {
  revisionId: string;
  revision: number;
  jobId: string;
  jobTitle: string;
  issuedAt: string;
  asBuilt: AsBuilt;
  analysis: AsBuiltAnalysis;
  /** The revision's job's work date (end, else start date), for records without provenance. */
  workDate?: string | null;
  /** Provenance of each record (snapshots issued since issue 21). */
  siteRecords?: Record<string, SiteRecordInfo>;
  /** Records this revision's job took out of the ground: dropped from the map. */
  removedIds?: readonly string[];
}

/**
 * Builds the cumulative site map from the latest ready revision of each job (the caller picks them),
 * oldest issue first, so a feature recorded again by a later job replaces the earlier one (same id).
 * Only what someone digging needs is copied: no notes, serials, models, warranty or people. The frame
 * (north, GPS origin) is the newest revision's; each revision's features are georeferenced with the
 * frame frozen in that revision, so the GeoJSON matches what its packet printed.
 */
export function buildSiteMap(sources: readonly SiteMapSource[]): SiteMap {
  const ordered = [...sources].sort((a, b) => a.issuedAt.localeCompare(b.issuedAt));
  const referencePoints = new Map<string, SiteMap['referencePoints'][number]>();
  const items = new Map<string, SiteMapItem>();
  const runs = new Map<string, SiteMapRun>();
  const features = new Map<string, GeoJsonFeature>();
  let hasGeo = false;

  for (const source of ordered) {
    const { asBuilt, analysis } = source;
    const from = { revisionId: source.revisionId, revision: source.revision, jobId: source.jobId, jobTitle: source.jobTitle };
    // Who put each record in and when: the snapshot's provenance, else the revision's own job and work date.
    const provenance = (id: string) => {
      const info = source.siteRecords?.[id];
      return info
        ? { installedByJobId: info.installedBy.jobId, installedByJobTitle: info.installedBy.jobTitle, installedOn: info.installedOn, abandonedOn: info.abandoned?.on ?? null }
        : { installedByJobId: source.jobId, installedByJobTitle: source.jobTitle, installedOn: source.workDate ?? null, abandonedOn: null };
    };
    for (const p of asBuilt.referencePoints) referencePoints.set(p.id, { id: p.id, label: p.label, x: p.x, y: p.y });

    const positions = new Map(analysis.positions.map((p) => [p.itemId, p]));
    for (const item of asBuilt.items) {
      const pos = positions.get(item.id);
      items.set(item.id, {
        ...from,
        ...provenance(item.id),
        id: item.id,
        kind: item.kind,
        label: item.label,
        position: pos ? { x: pos.x, y: pos.y, source: pos.source, accuracyM: pos.accuracyM } : null,
        ties: (item.ties ?? []).map((t) => ({ referencePointId: t.referencePointId, distanceM: t.distanceM })),
        wallEntry:
          item.kind === 'wall_entry'
            ? {
                wallMaterial: item.wallMaterial ?? null,
                holeDiameterM: item.holeDiameterM ?? null,
                sleeve: item.sleeve ?? null,
                sealant: item.sealant ?? null,
                insideLocation: item.insideLocation ?? null,
                outsideLocation: item.outsideLocation ?? null,
              }
            : null,
        isCapped: item.kind === 'spare_end' ? item.isCapped : null,
      });
    }

    const depthByRun = new Map(analysis.depth.map((d) => [d.runId, d]));
    const runList: SiteMapRun[] = asBuilt.runs.map((run) => {
      const depth = depthByRun.get(run.id);
      const a = positions.get(run.fromItemId);
      const b = positions.get(run.toItemId);
      const route: PlanPoint[] | null = run.route ?? (a && b ? [{ x: a.x, y: a.y }, { x: b.x, y: b.y }] : null);
      return {
        ...from,
        ...provenance(run.id),
        id: run.id,
        label: run.label,
        fromItemId: run.fromItemId,
        toItemId: run.toItemId,
        cableType: run.cableType,
        gauge: formatGauge(run.gauge),
        conductors: run.conductors,
        method: run.method,
        location: run.location ?? 'general',
        measuredLengthM: run.measuredLengthM,
        minDepthM: depth?.minDepthM ?? null,
        maxDepthM: depth?.maxDepthM ?? null,
        depthReadings: [...(run.depthReadings ?? [])].sort((x, y) => x.stationM - y.stationM).map((r) => ({ stationM: r.stationM, depthM: r.depthM })),
        minCoverM: depth?.rule?.minCoverM ?? null,
        // Abandoned runs are reported by the depth check but are no hazard to flag as shallow.
        isShallow: run.isAbandoned !== true && (depth?.shallowStations.length ?? 0) > 0,
        route: route ? route.map((p) => ({ x: p.x, y: p.y })) : null,
        isRouteDrawn: run.route !== undefined,
        isSpare: run.isSpare === true,
        isAbandoned: run.isAbandoned === true,
      };
    });
    for (const run of runList) runs.set(run.id, run);
    for (const id of source.removedIds ?? []) {
      runs.delete(id);
      items.delete(id);
      features.delete(id);
    }

    const origin = asBuilt.site?.origin;
    if (origin !== undefined) {
      hasGeo = true;
      const frame = createLocalFrame(origin, asBuilt.site?.northAzimuthDeg ?? 0);
      const runInputs: GeoJsonRunInput[] = runList.map((run) => ({
        id: run.id,
        route: run.route,
        properties: {
          featureKind: 'run',
          label: run.label,
          cableType: run.cableType,
          gauge: run.gauge,
          method: run.method,
          minDepthM: run.minDepthM,
          maxDepthM: run.maxDepthM,
          isSpare: run.isSpare,
          isAbandoned: run.isAbandoned,
          revisionId: run.revisionId,
          revision: run.revision,
          jobTitle: run.jobTitle,
          // RFC 7946 allows any JSON in properties; the shared GeoJSON type is narrower than that.
          planRoute: (run.route ? run.route.map((p) => [p.x, p.y]) : null) as unknown as string[] | null,
        },
      }));
      const itemInputs: GeoJsonItemInput[] = asBuilt.items.map((item) => {
        const entry = items.get(item.id)!;
        return {
          id: item.id,
          position: entry.position ? { x: entry.position.x, y: entry.position.y } : null,
          properties: {
            featureKind: 'item',
            kind: entry.kind,
            label: entry.label,
            accuracyM: entry.position?.accuracyM ?? null,
            revisionId: entry.revisionId,
            revision: entry.revision,
            jobTitle: entry.jobTitle,
            planX: entry.position?.x ?? null,
            planY: entry.position?.y ?? null,
          },
        };
      });
      for (const feature of buildFeatureCollection(frame, runInputs, itemInputs).features) features.set(feature.id, feature);
    }
  }

  const newest = ordered.at(-1);
  const origin = newest?.asBuilt.site?.origin;
  const orderedFeatures = [...features.values()].sort((a, b) => kindOrder(a) - kindOrder(b));
  return {
    frame: { northAzimuthDeg: newest?.asBuilt.site?.northAzimuthDeg ?? 0, origin: origin ? { lat: origin.lat, lon: origin.lon } : null },
    revisions: ordered.map((s) => ({ revisionId: s.revisionId, revision: s.revision, jobId: s.jobId, jobTitle: s.jobTitle, issuedAt: s.issuedAt })),
    referencePoints: [...referencePoints.values()],
    siteFeatures: (newest?.asBuilt.site?.features ?? []).map((f) => ({ id: f.id, kind: f.kind, name: f.name, shape: f.shape, points: f.points.map((p) => ({ x: p.x, y: p.y })) })),
    items: [...items.values()],
    runs: [...runs.values()],
    geojson: hasGeo ? ({ type: 'FeatureCollection', features: orderedFeatures } as SiteMapGeoJson) : null,
  };
}

/** Runs before items, so that items draw on top in most viewers (as in the packet's GeoJSON). */
function kindOrder(feature: GeoJsonFeature): number {
  return feature.properties.featureKind === 'run' ? 0 : 1;
}
