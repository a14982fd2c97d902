import { select } from 'd3-selection';
import { zoom, zoomIdentity, type ZoomBehavior, type ZoomTransform } from 'd3-zoom';
import { useCallback, useEffect, useId, useLayoutEffect, useRef, useState } from 'react';
import { formatDate } from '@domain/format/date-time';
import { mapItemLabel } from '@domain/locate/item-map-label';
import type { SiteMap } from '@domain/locate/site-map.schema';

import { FEATURE_FILL, FEATURE_LABEL, FEATURE_STROKE, INK, PAPER, REFERENCE_INK, RUN_STROKES, runStyleKey, scaleDash, type LegendKey } from '@drawings/marking-palette';

import { MarkingLegend } from '../../../components/marking-legend';
import { PlainButton } from '../../../components/plain/controls';
import { AddIcon, MaximizeIcon, SubtractIcon } from '../../../components/plain/icons';
import { scaleBarFor } from '../../../lib/scale-bar';
import { formatLength, type LengthSystem } from '../../../lib/units';
import { placeMapLabels, type Box, type MapLabelRequest } from '../utils/map-labels';
import type { PlanPosition } from '../utils/my-position';
import { ACCURACY_SHADE, COMPASS_RING, OVERLAY_PAPER_MAP } from '../../../config/canvas-theme';

import styles from './site-map-plan.module.css';

/** Screen pixels per print point for run strokes (as the plan editor). */
const SCREEN_SCALE = 1.9;
/** Every label on the map, screen pixels (never smaller: read at arm's length outdoors). */
const LABEL_PX = 13;

type MapRun = SiteMap['runs'][number];
type Point = { x: number; y: number };

/** The legend entries this map draws, in legend order. */
export function siteMapLegendKeys(map: SiteMap): LegendKey[] {
  const keys = new Set<LegendKey>();
  for (const run of map.runs) {
    if (!run.route || run.route.length < 2) continue;
    keys.add(run.isRouteDrawn ? `run:${runStyleKey(run)}` : 'route_not_recorded');
  }
  if (map.items.some((i) => i.position !== null && i.kind === 'wall_entry')) keys.add('wall_entry');
  if (map.referencePoints.length > 0) keys.add('reference_point');
  if (map.siteFeatures.length > 0) keys.add('feature');
  const order: LegendKey[] = [
    'run:direct_burial',
    'run:conduit',
    'run:under_hardscape_sleeve',
    'run:indoor',
    'run:spare',
    'run:abandoned',
    'route_not_recorded',
    'wall_entry',
    'reference_point',
    'feature',
  ];
  return order.filter((k) => keys.has(k));
}

type SiteMapPlanProps = {
  map: SiteMap;
  units: LengthSystem;
  /** Highlights this run (tapped on the map or in the list) and marks its shallowest reading. */
  selectedRunId?: string;
  onSelectRun?: (runId: string) => void;
  /** Runs with a reading shallower than the depth rule: drawn with a warning mark. */
  shallowRunIds?: ReadonlySet<string>;
  /** Draws the taped ties from the reference points to every tied item. */
  showTies?: boolean;
  /** The viewer's phone position on the plan, drawn as a dot in its accuracy circle. */
  myPosition?: PlanPosition;
  /** The legend's spelling: the installer's locale on a public page, the signed-in company's in the app. */
  locale: string | null | undefined;
};

/** The min depth as the label of a run on the map. */
export function depthLabel(minDepthM: number | null, units: LengthSystem): string {
  return minDepthM === null ? 'depth not recorded' : `min ${formatLength(minDepthM, units, 'short')}`;
}

/**
 * A run's label on the map (issue 21: labels name runs, not just depths): its name and shallowest
 * depth, and since when it is abandoned. When it went in and by which job is in its tooltip and the list.
 */
export function runMapLabel(run: Pick<MapRun, 'label' | 'minDepthM' | 'isAbandoned' | 'abandonedOn'>, units: LengthSystem): string {
  const abandoned = run.isAbandoned ? (run.abandonedOn ? ` (abandoned since ${formatDate(run.abandonedOn)})` : ' (abandoned)') : '';
  return `${run.label}: ${depthLabel(run.minDepthM, units)}${abandoned}`;
}

/** When the run went in and by which job, and since when it is abandoned (the run's tooltip). */
export function runProvenanceText(run: Pick<MapRun, 'label' | 'installedOn' | 'installedByJobTitle' | 'jobTitle' | 'abandonedOn'>): string {
  const by = `by “${run.installedByJobTitle ?? run.jobTitle}”`;
  const installed = run.installedOn ? `installed ${formatDate(run.installedOn)} ${by}` : `installed ${by}, date not recorded`;
  return `${run.label} (${installed}${run.abandonedOn ? `, abandoned since ${formatDate(run.abandonedOn)}` : ''})`;
}

function centroid(points: readonly Point[]): Point {
  const n = Math.max(points.length, 1);
  return { x: points.reduce((a, p) => a + p.x, 0) / n, y: points.reduce((a, p) => a + p.y, 0) / n };
}

function boundsOf(points: Point[]) {
  const xs = points.map((p) => p.x);
  const ys = points.map((p) => p.y);
  return { minX: Math.min(...xs), maxX: Math.max(...xs), minY: Math.min(...ys), maxY: Math.max(...ys) };
}

/** The point `fraction` (0…1) of the way along a polyline by length. */
export function pointAlong(route: readonly Point[], fraction: number): Point {
  const first = route[0] ?? { x: 0, y: 0 };
  if (route.length < 2) return first;
  const lengths = route.slice(1).map((p, i) => Math.hypot(p.x - route[i]!.x, p.y - route[i]!.y));
  const total = lengths.reduce((a, b) => a + b, 0);
  let remaining = total * Math.min(1, Math.max(0, fraction));
  for (let i = 0; i < lengths.length; i += 1) {
    const a = route[i]!;
    const b = route[i + 1]!;
    const segment = lengths[i]!;
    if (remaining <= segment || i === lengths.length - 1) {
      const t = segment === 0 ? 0 : Math.min(1, remaining / segment);
      return { x: a.x + (b.x - a.x) * t, y: a.y + (b.y - a.y) * t };
    }
    remaining -= segment;
  }
  return first;
}

/**
 * Where the run's shallowest reading lies on its drawn route: its station as a share of the measured
 * length, laid along the route (the route is drawn to scale, the measured length is the tape's).
 */
export function shallowestPointOf(run: Pick<MapRun, 'route' | 'depthReadings' | 'measuredLengthM'>): { point: Point; depthM: number } | undefined {
  if (!run.route || run.route.length < 2 || run.depthReadings.length === 0) return undefined;
  const shallowest = run.depthReadings.reduce((a, b) => (b.depthM < a.depthM ? b : a));
  const fraction = run.measuredLengthM > 0 ? shallowest.stationM / run.measuredLengthM : 0;
  return { point: pointAlong(run.route, fraction), depthM: shallowest.depthM };
}

const FALLBACK_SIZE = { width: 360, height: 420 };
/** Screen boxes kept free of labels: the scale bar (bottom left), north arrow (top right), zoom buttons (bottom right). */
function reservedBoxes(size: { width: number; height: number }): Box[] {
  return [
    { left: 0, top: size.height - 52, right: 170, bottom: size.height },
    { left: size.width - 64, top: 0, right: size.width, bottom: 64 },
    { left: size.width - 64, top: size.height - 170, right: size.width, bottom: size.height },
  ];
}

/** The map's empty frame, the size of the map: what stands in its place until it is drawn. */
export function SiteMapPlanPlaceholder() {
  return (
    <div className={styles.figure} aria-hidden="true">
      <div className={styles.frame} style={{ backgroundColor: PAPER }} />
    </div>
  );
}

/**
 * The site plan, from plan coordinates (metres, x right, y up), panned and pinch-zoomed with d3-zoom
 * (touch, mouse wheel and drag, and the +/−/fit buttons). Lines and symbols keep their screen size; a
 * scale bar in the viewer's units follows the zoom; a north arrow; labels of at least 12 px placed
 * where they fit, the least important left out when there is no room.
 */
export function SiteMapPlan({ map, units, selectedRunId, onSelectRun, shallowRunIds, showTies = false, myPosition, locale }: SiteMapPlanProps) {
  const titleId = useId();
  const svgRef = useRef<SVGSVGElement>(null);
  const zoomRef = useRef<ZoomBehavior<SVGSVGElement, unknown> | undefined>(undefined);
  const [transform, setTransform] = useState<ZoomTransform>(zoomIdentity);
  const [size, setSize] = useState(FALLBACK_SIZE);
  const sizeRef = useRef(size);
  sizeRef.current = size;
  const hasUserMoved = useRef(false);
  /** A pan ends with a click on whatever it started on: that click is not a tap. */
  const movedSincePointerDown = useRef(false);

  const located = map.items.filter((item) => item.position !== null);
  const runs = map.runs.filter((run) => run.route && run.route.length >= 2);
  const points: Point[] = [
    ...map.siteFeatures.flatMap((f) => f.points),
    ...map.referencePoints,
    ...located.map((item) => item.position!),
    ...runs.flatMap((run) => run.route!),
  ];
  const isEmpty = points.length === 0;
  const extent = isEmpty ? { minX: -5, maxX: 5, minY: -5, maxY: 5 } : boundsOf(points);
  const extentRef = useRef(extent);
  extentRef.current = extent;

  const measure = useCallback(() => {
    const rect = svgRef.current?.getBoundingClientRect();
    if (rect && rect.width > 0 && rect.height > 0) setSize({ width: rect.width, height: rect.height });
  }, []);

  useLayoutEffect(() => {
    measure();
    if (typeof ResizeObserver === 'undefined') return;
    const observer = new ResizeObserver(measure);
    if (svgRef.current) observer.observe(svgRef.current);
    return () => observer.disconnect();
  }, [measure, isEmpty]);

  useEffect(() => {
    const svg = svgRef.current;
    if (!svg) return;
    const behavior = zoom<SVGSVGElement, unknown>()
      .scaleExtent([0.5, 2000])
      .extent(() => [
        [0, 0],
        [sizeRef.current.width, sizeRef.current.height],
      ])
      .filter((event: Event & { button?: number; ctrlKey?: boolean }) => !(event.ctrlKey === true && event.type !== 'wheel') && (event.button ?? 0) === 0)
      .on('start', () => {
        movedSincePointerDown.current = false;
      })
      .on('zoom', (event: { transform: ZoomTransform; sourceEvent: Event | null }) => {
        if (event.sourceEvent) {
          hasUserMoved.current = true;
          movedSincePointerDown.current = true;
        }
        setTransform(event.transform);
      });
    zoomRef.current = behavior;
    select(svg).call(behavior).on('dblclick.zoom', null);
    return () => {
      select(svg).on('.zoom', null);
    };
  }, [isEmpty]);

  const fit = useCallback(() => {
    const svg = svgRef.current;
    const behavior = zoomRef.current;
    if (!svg || !behavior) return;
    const e = extentRef.current;
    const pad = { top: 64, right: 64, bottom: 56, left: 24 };
    const w = Math.max(e.maxX - e.minX, 4);
    const h = Math.max(e.maxY - e.minY, 4);
    const innerW = Math.max(size.width - pad.left - pad.right, 40);
    const innerH = Math.max(size.height - pad.top - pad.bottom, 40);
    const k = Math.min(innerW / w, innerH / h);
    const cx = (e.minX + e.maxX) / 2;
    const cy = -(e.minY + e.maxY) / 2;
    const centre = { x: pad.left + innerW / 2, y: pad.top + innerH / 2 };
    select(svg).call(behavior.transform, zoomIdentity.translate(centre.x - cx * k, centre.y - cy * k).scale(k));
  }, [size]);

  useEffect(() => {
    if (!hasUserMoved.current) fit();
  }, [fit, isEmpty]);

  const zoomBy = (factor: number) => {
    if (!svgRef.current || !zoomRef.current) return;
    hasUserMoved.current = true;
    zoomRef.current.scaleBy(select(svgRef.current), factor);
  };

  if (isEmpty) {
    return <p className={styles.empty}>Nothing on this site has a position on the plan yet.</p>;
  }

  const sx = (x: number) => transform.applyX(x);
  const sy = (y: number) => transform.applyY(-y);
  const path = (pts: readonly Point[]) => pts.map((p) => `${sx(p.x)},${sy(p.y)}`).join(' ');
  const legendKeys = siteMapLegendKeys(map);
  const labelOf = (id: string) => map.items.find((item) => item.id === id)?.label;
  const referenceById = new Map(map.referencePoints.map((p) => [p.id, p]));
  const selectedRun = runs.find((run) => run.id === selectedRunId);
  const shallowest = selectedRun ? shallowestPointOf(selectedRun) : undefined;
  const ties = showTies
    ? located.flatMap((item) =>
        item.ties.flatMap((tie) => {
          const ref = referenceById.get(tie.referencePointId);
          return ref ? [{ id: `${item.id}:${tie.referencePointId}`, from: ref, to: item.position!, distanceM: tie.distanceM, itemLabel: item.label, refLabel: ref.label }] : [];
        }),
      )
    : [];

  // Labels, most important first: the tapped run and its shallowest point, shallow runs, other runs,
  // tie distances, items, reference points, landmarks.
  const around = (p: Point, gap: number, fontSize: number): MapLabelRequest['spots'] => [
    { x: p.x + gap, y: p.y + fontSize / 3, textAnchor: 'start' },
    { x: p.x - gap, y: p.y + fontSize / 3, textAnchor: 'end' },
    { x: p.x, y: p.y - gap, textAnchor: 'middle' },
    { x: p.x, y: p.y + gap + fontSize * 0.7, textAnchor: 'middle' },
  ];
  const requests: MapLabelRequest[] = [];
  for (const run of runs) {
    const selected = run.id === selectedRunId;
    const shallow = shallowRunIds?.has(run.id) ?? false;
    const text = `${shallow ? '⚠ ' : ''}${runMapLabel(run, units)}`;
    const spots = [0.5, 0.35, 0.65, 0.2, 0.8].flatMap((f) => {
      const p = pointAlong(run.route!, f);
      return around({ x: sx(p.x), y: sy(p.y) }, 10, LABEL_PX).slice(2).concat(around({ x: sx(p.x), y: sy(p.y) }, 10, LABEL_PX).slice(0, 2));
    });
    requests.push({ id: `run:${run.id}`, text, fontSize: LABEL_PX, fontWeight: selected || shallow ? 'bold' : 'normal', priority: selected ? 0 : shallow ? 2 : 3, spots });
  }
  if (selectedRun && shallowest) {
    const p = { x: sx(shallowest.point.x), y: sy(shallowest.point.y) };
    requests.push({ id: 'shallowest', text: `shallowest ${formatLength(shallowest.depthM, units, 'short')}`, fontSize: LABEL_PX, fontWeight: 'bold', priority: 1, spots: around(p, 14, LABEL_PX) });
  }
  if (myPosition) {
    const p = { x: sx(myPosition.x), y: sy(myPosition.y) };
    requests.push({ id: 'me', text: `You (± ${formatLength(myPosition.accuracyM, units, 'long')})`, fontSize: LABEL_PX, fontWeight: 'bold', priority: 1, spots: around(p, 14, LABEL_PX) });
  }
  for (const tie of ties) {
    const mid = { x: (sx(tie.from.x) + sx(tie.to.x)) / 2, y: (sy(tie.from.y) + sy(tie.to.y)) / 2 };
    requests.push({ id: `tie:${tie.id}`, text: formatLength(tie.distanceM, units, 'long'), fontSize: 12, priority: 4, spots: [{ x: mid.x, y: mid.y - 4, textAnchor: 'middle' }, { x: mid.x, y: mid.y + 14, textAnchor: 'middle' }, ...around(mid, 8, 12)] });
  }
  for (const item of located) {
    const p = { x: sx(item.position!.x), y: sy(item.position!.y) };
    requests.push({ id: `item:${item.id}`, text: mapItemLabel(item), fontSize: 12, priority: 5, spots: around(p, 12, 12) });
  }
  for (const ref of map.referencePoints) {
    const p = { x: sx(ref.x), y: sy(ref.y) };
    requests.push({ id: `ref:${ref.id}`, text: ref.label, fontSize: 12, fontWeight: 'bold', priority: 6, spots: around(p, 12, 12) });
  }
  for (const f of map.siteFeatures) {
    const c = f.shape === 'polygon' ? centroid(f.points) : pointAlong(f.points, 0.5);
    const p = { x: sx(c.x), y: sy(c.y) };
    requests.push({ id: `feature:${f.id}`, text: f.name, fontSize: 12, priority: 7, spots: [{ x: p.x, y: p.y + 4, textAnchor: 'middle' }, ...around(p, 8, 12)] });
  }
  const labels = placeMapLabels(requests, size, reservedBoxes(size));

  const bar = scaleBarFor(transform.k, Math.min(140, size.width / 3), units);
  const northCentre = { x: size.width - 34, y: 34 };

  const tapRun = (runId: string) => {
    if (movedSincePointerDown.current) {
      movedSincePointerDown.current = false;
      return;
    }
    onSelectRun?.(runId);
  };

  return (
    <figure className={styles.figure}>
      {/* The drawings' paper: the map stays light in a dark theme. */}
      <div className={styles.frame} style={{ backgroundColor: PAPER }}>
        <svg
          ref={svgRef}
          className={styles.svg}
          role="img"
          aria-labelledby={titleId}
          data-testid="locate-map"
          data-zoom={transform.k.toFixed(4)}
          onPointerDown={() => {
            movedSincePointerDown.current = false;
          }}
        >
          <title id={titleId}>Site plan of buried cables with their minimum depths</title>
          {/* Named parts carry a group or graphics-symbol role: ARIA allows aria-label only on an element with a role (axe: aria-prohibited-attr). */}
          <g data-layer="features" role="group" aria-label="Landmarks">
            {map.siteFeatures.map((f) => {
              const heavy = f.kind === 'fence' || f.kind === 'wall' || f.kind === 'house';
              return (
                <g key={f.id} data-feature-id={f.id} role="graphics-symbol" aria-label={f.name}>
                  {f.shape === 'polygon' ? (
                    <polygon points={path(f.points)} fill={FEATURE_FILL} stroke={FEATURE_STROKE} strokeWidth={heavy ? 1.6 : 1} />
                  ) : (
                    <polyline points={path(f.points)} fill="none" stroke={FEATURE_STROKE} strokeWidth={heavy ? 2 : 1.2} strokeDasharray={f.kind === 'path' ? '6 3' : undefined} />
                  )}
                </g>
              );
            })}
          </g>
          <g data-layer="ties" role="group" aria-label="Ties">
            {ties.map((tie) => (
              <line
                key={tie.id}
                data-tie={tie.id}
                x1={sx(tie.from.x)}
                y1={sy(tie.from.y)}
                x2={sx(tie.to.x)}
                y2={sy(tie.to.y)}
                stroke={REFERENCE_INK}
                strokeWidth={1}
                strokeDasharray="4 3"
                role="graphics-symbol"
                aria-label={`${tie.refLabel} to ${tie.itemLabel}: ${formatLength(tie.distanceM, units, 'long')}`}
              />
            ))}
          </g>
          {runs.map((run) => {
            const selected = run.id === selectedRunId;
            const shallow = shallowRunIds?.has(run.id) ?? false;
            // Every run orange (APWA uniform colour code: signal cable); weight and dash tell the kinds apart.
            const spec = !run.isRouteDrawn ? RUN_STROKES.route_not_recorded : RUN_STROKES[runStyleKey(run)];
            const width = Math.max(spec.width * SCREEN_SCALE, 1.5);
            return (
              <g
                key={run.id}
                data-run-id={run.id}
                data-selected={selected ? 'true' : undefined}
                data-shallow={shallow ? 'true' : undefined}
                role="group"
                aria-label={`${run.label}: ${depthLabel(run.minDepthM, units)}${run.isAbandoned ? ', abandoned' : ''}${shallow ? ', shallower than the depth rule' : ''}`}
                onClick={onSelectRun ? () => tapRun(run.id) : undefined}
                style={onSelectRun ? { cursor: 'pointer' } : undefined}
              >
                <title>{runProvenanceText(run)}</title>
                {selected && <polyline points={path(run.route!)} fill="none" stroke={REFERENCE_INK} strokeOpacity={0.25} strokeWidth={width * 2 + 10} strokeLinecap="round" strokeLinejoin="round" data-role="highlight" />}
                <polyline
                  points={path(run.route!)}
                  fill="none"
                  stroke={spec.color}
                  strokeWidth={width * (selected ? 1.8 : 1)}
                  strokeDasharray={scaleDash(spec.dash, SCREEN_SCALE)}
                  strokeLinecap={spec.linecap}
                  data-role="run-stroke"
                  strokeLinejoin="round"
                />
                {/* A wide invisible line: easier to tap on a phone. */}
                <polyline points={path(run.route!)} fill="none" stroke="transparent" strokeWidth={28} data-role="run-hit" />
              </g>
            );
          })}
          {map.referencePoints.map((p) => (
            <g key={`ref-${p.id}`} role="graphics-symbol" aria-label={`Reference point ${p.label}`}>
              {/* A survey-style ring with a cross, in black (never a marking colour). */}
              <circle cx={sx(p.x)} cy={sy(p.y)} r={5} fill={PAPER} stroke={REFERENCE_INK} strokeWidth={1.5} />
              <path d={`M ${sx(p.x) - 9} ${sy(p.y)} H ${sx(p.x) + 9} M ${sx(p.x)} ${sy(p.y) - 9} V ${sy(p.y) + 9}`} stroke={REFERENCE_INK} strokeWidth={1.5} data-role="reference-stroke" />
            </g>
          ))}
          {located.map((item) => {
            const p = item.position!;
            const isWall = item.kind === 'wall_entry';
            return (
              <g key={`item-${item.id}`} role="graphics-symbol" aria-label={mapItemLabel(item)}>
                {isWall ? (
                  <g>
                    {/* As printed: a square half filled along its diagonal (a sleeve through a wall). */}
                    <rect x={sx(p.x) - 7} y={sy(p.y) - 7} width={14} height={14} fill={PAPER} stroke={REFERENCE_INK} strokeWidth={1.5} />
                    <path d={`M ${sx(p.x) - 7} ${sy(p.y) - 7} L ${sx(p.x) - 7} ${sy(p.y) + 7} L ${sx(p.x) + 7} ${sy(p.y) + 7} Z`} fill={REFERENCE_INK} />
                  </g>
                ) : (
                  <circle cx={sx(p.x)} cy={sy(p.y)} r={5} fill={INK} />
                )}
              </g>
            );
          })}
          {selectedRun && shallowest && (
            <g data-role="shallowest" role="graphics-symbol" aria-label={`Shallowest point of ${selectedRun.label}: ${formatLength(shallowest.depthM, units, 'short')}`} pointerEvents="none">
              <circle cx={sx(shallowest.point.x)} cy={sy(shallowest.point.y)} r={11} fill="none" stroke={REFERENCE_INK} strokeWidth={2.5} />
              <path
                d={`M ${sx(shallowest.point.x) - 16} ${sy(shallowest.point.y)} H ${sx(shallowest.point.x) - 6} M ${sx(shallowest.point.x) + 6} ${sy(shallowest.point.y)} H ${sx(shallowest.point.x) + 16}`}
                stroke={REFERENCE_INK}
                strokeWidth={2.5}
              />
            </g>
          )}
          {myPosition && (
            <g data-role="my-position" role="graphics-symbol" aria-label={`Your position, good to about ${formatLength(myPosition.accuracyM, units, 'long')}`} pointerEvents="none">
              {/* Black and grey only: every colour of the marking code means a utility. */}
              <circle cx={sx(myPosition.x)} cy={sy(myPosition.y)} r={Math.max(myPosition.accuracyM * transform.k, 8)} fill={ACCURACY_SHADE} stroke={INK} strokeWidth={1} strokeDasharray="3 3" data-role="accuracy" />
              <circle cx={sx(myPosition.x)} cy={sy(myPosition.y)} r={7} fill={INK} stroke={PAPER} strokeWidth={3} data-role="dot" />
            </g>
          )}
          <g data-layer="labels" pointerEvents="none">
            {labels.map((label) => {
              const isFeature = label.id.startsWith('feature:');
              const isRef = label.id.startsWith('ref:');
              return (
                <text
                  key={label.id}
                  data-label={label.id}
                  x={label.x}
                  y={label.y}
                  fontSize={label.fontSize}
                  fontWeight={label.fontWeight}
                  fontStyle={isFeature ? 'italic' : undefined}
                  textAnchor={label.textAnchor}
                  fill={isFeature ? FEATURE_LABEL : isRef ? REFERENCE_INK : INK}
                  stroke={PAPER}
                  strokeWidth={3}
                  paintOrder="stroke"
                >
                  {label.text}
                </text>
              );
            })}
          </g>
          <g data-layer="scale-bar" transform={`translate(14, ${size.height - 20})`} pointerEvents="none">
            <rect x={-8} y={-24} width={bar.pixels + 16} height={36} rx={4} fill={OVERLAY_PAPER_MAP} />
            <rect x={0} y={0} width={bar.pixels / 2} height={6} fill={INK} />
            <rect x={bar.pixels / 2} y={0} width={bar.pixels / 2} height={6} fill={PAPER} stroke={INK} strokeWidth={1} />
            <text x={0} y={-8} fontSize={13} fill={INK} data-testid="scale-bar-label">
              {bar.label}
            </text>
          </g>
          <g data-layer="north-arrow" transform={`translate(${northCentre.x}, ${northCentre.y})`} pointerEvents="none" role="graphics-symbol" aria-label="North arrow">
            <circle r={26} fill={OVERLAY_PAPER_MAP} stroke={COMPASS_RING} strokeWidth={1} />
            {/* Plan +y points at bearing `northAzimuthDeg`: true north is that many degrees anticlockwise of up. */}
            <g transform={`rotate(${-map.frame.northAzimuthDeg})`} data-testid="north-arrow">
              <polygon points="0,-20 7,8 0,3 -7,8" fill={INK} />
              <text textAnchor="middle" y={19} fontSize={12} fontWeight={700} fill={INK}>
                N
              </text>
            </g>
          </g>
        </svg>
        <div className={styles.zoomButtons}>
          {/* Named by aria-label, with the browser's own tooltip (title) for a mouse. */}
          <PlainButton className={styles.zoomButton} icon={<AddIcon />} aria-label="Zoom in" title="Zoom in" onClick={() => zoomBy(1.6)} />
          <PlainButton className={styles.zoomButton} icon={<SubtractIcon />} aria-label="Zoom out" title="Zoom out" onClick={() => zoomBy(1 / 1.6)} />
          <PlainButton
            className={styles.zoomButton}
            icon={<MaximizeIcon />}
            aria-label="Show the whole site"
            title="Show the whole site"
            onClick={() => {
              hasUserMoved.current = false;
              fit();
            }}
          />
        </div>
      </div>
      <figcaption className={styles.legend}>
        <MarkingLegend keys={legendKeys} locale={locale} />
        {myPosition && <span>Black dot in a dashed circle: where your phone puts you, and how far off that may be.</span>}
        <span>Each run is labelled with its shallowest recorded depth. Pinch or scroll to zoom, drag to move; labels that do not fit are shown when you zoom in.</span>
        {runs.length < map.runs.length && (
          <span>
            {map.runs.length - runs.length} run(s) without a known route:{' '}
            {map.runs
              .filter((run) => !run.route || run.route.length < 2)
              .map((run) => `${run.label} (${labelOf(run.fromItemId) ?? '?'} → ${labelOf(run.toItemId) ?? '?'})`)
              .join(', ')}
          </span>
        )}
      </figcaption>
    </figure>
  );
}
