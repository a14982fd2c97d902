import { makeStyles, tokens } from '@fluentui/react-components';
import { useId } from 'react';
import type { SiteMap } from '@domain/locate/site-map.schema';

import { FEATURE_FILL, FEATURE_LABEL, FEATURE_STROKE, PAPER, REFERENCE_INK, RUN_STROKES, scaleDash, type LegendKey, type RunStyleKey } from '@drawings/marking-palette';

import { MarkingLegend } from '../../../components/marking-legend';
import { formatLength, type LengthSystem } from '../../../lib/units';

/** Screen pixels per print point for run strokes (as the plan editor). */
const SCREEN_SCALE = 1.9;

type MapRun = SiteMap['runs'][number];

export function runStyleKey(run: Pick<MapRun, 'isAbandoned' | 'isSpare' | 'method'>): RunStyleKey {
  return run.isAbandoned ? 'abandoned' : run.isSpare ? 'spare' : run.method;
}

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

const useStyles = makeStyles({
  figure: { margin: 0, display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalS },
  svg: {
    width: '100%',
    height: 'auto',
    maxHeight: '70vh',
    borderRadius: tokens.borderRadiusLarge,
    backgroundColor: tokens.colorNeutralBackground1,
    border: `${tokens.strokeWidthThin} solid ${tokens.colorNeutralStroke2}`,
    touchAction: 'pinch-zoom',
  },
  legend: {
    display: 'flex',
    flexWrap: 'wrap',
    gap: tokens.spacingHorizontalL,
    color: tokens.colorNeutralForeground2,
    fontSize: tokens.fontSizeBase200,
  },
  empty: { color: tokens.colorNeutralForeground2 },
});

type Point = { x: number; y: number };

type SiteMapPlanProps = {
  map: SiteMap;
  units: LengthSystem;
  /** Highlights this run (tapped in the list). */
  selectedRunId?: string;
  onSelectRun?: (runId: string) => void;
};

/** The min depth as the label of a run on the map. */
export function depthLabel(minDepthM: number | null, units: LengthSystem): string {
  return minDepthM === null ? 'depth not recorded' : `min ${formatLength(minDepthM, units, 'short')}`;
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

/** The middle of a polyline by length: where its depth label goes. */
function midpointOf(route: Point[]): { point: Point; angleDeg: number } {
  const first = route[0] ?? { x: 0, y: 0 };
  if (route.length < 2) return { point: first, angleDeg: 0 };
  const lengths = route.slice(1).map((p, i) => Math.hypot(p.x - route[i]!.x, p.y - route[i]!.y));
  let remaining = lengths.reduce((a, b) => a + b, 0) / 2;
  for (let i = 0; i < lengths.length; i += 1) {
    const a = route[i]!;
    const b = route[i + 1]!;
    const segment = lengths[i]!;
    if (remaining <= segment || i === lengths.length - 1) {
      const t = segment === 0 ? 0 : Math.min(1, remaining / segment);
      let angleDeg = (Math.atan2(-(b.y - a.y), b.x - a.x) * 180) / Math.PI;
      if (angleDeg > 90) angleDeg -= 180;
      if (angleDeg < -90) angleDeg += 180;
      return { point: { x: a.x + (b.x - a.x) * t, y: a.y + (b.y - a.y) * t }, angleDeg };
    }
    remaining -= segment;
  }
  return { point: first, angleDeg: 0 };
}

/**
 * The site plan as SVG, from plan coordinates (metres, x right, y up): runs as lines labelled with their
 * minimum depth, items and wall entries as marks, reference points as squares, and a north arrow.
 */
export function SiteMapPlan({ map, units, selectedRunId, onSelectRun }: SiteMapPlanProps) {
  const styles = useStyles();
  const titleId = useId();
  const located = map.items.filter((item) => item.position !== null);
  const runs = map.runs.filter((run) => run.route && run.route.length >= 2);
  const points: Point[] = [
    ...map.siteFeatures.flatMap((f) => f.points),
    ...map.referencePoints,
    ...located.map((item) => item.position!),
    ...runs.flatMap((run) => run.route!),
  ];
  if (points.length === 0) {
    return <p className={styles.empty}>Nothing on this site has a position on the plan yet.</p>;
  }

  const b = boundsOf(points);
  const span = Math.max(b.maxX - b.minX, b.maxY - b.minY, 4);
  const pad = span * 0.16;
  const font = span / 32;
  // SVG y grows downwards; the plan's y grows upwards.
  const sx = (x: number) => x;
  const sy = (y: number) => -y;
  const viewBox = [b.minX - pad, -b.maxY - pad, b.maxX - b.minX + pad * 2, b.maxY - b.minY + pad * 2].join(' ');
  // In the top-right margin, clear of the drawing.
  const arrowAt = { x: b.maxX + pad * 0.65, y: -b.maxY - pad * 0.55 };
  const legendKeys = siteMapLegendKeys(map);
  const labelOf = (id: string) => map.items.find((item) => item.id === id)?.label;

  return (
    <figure className={styles.figure}>
      <svg className={styles.svg} viewBox={viewBox} role="img" aria-labelledby={titleId} preserveAspectRatio="xMidYMid meet">
        <title id={titleId}>Site plan of buried cables with their minimum depths</title>
        <g aria-label="North arrow" transform={`translate(${arrowAt.x} ${arrowAt.y}) rotate(${map.frame.northAzimuthDeg})`}>
          <path d={`M 0 ${-font * 1.8} L ${font * 0.7} ${font * 0.6} L 0 0 L ${-font * 0.7} ${font * 0.6} Z`} fill={tokens.colorNeutralForeground1} />
          <text y={font * 2} fontSize={font * 1.1} textAnchor="middle" fill={tokens.colorNeutralForeground1} fontWeight="bold">
            N
          </text>
        </g>
        <g data-layer="features" aria-label="Landmarks">
          {map.siteFeatures.map((f) => {
            const pts = f.points.map((p) => `${sx(p.x)},${sy(p.y)}`).join(' ');
            const heavy = f.kind === 'fence' || f.kind === 'wall' || f.kind === 'house';
            const centre = f.shape === 'polygon' ? centroid(f.points) : midpointOf(f.points).point;
            return (
              <g key={f.id} data-feature-id={f.id} aria-label={f.name}>
                {f.shape === 'polygon' ? (
                  <polygon points={pts} fill={FEATURE_FILL} stroke={FEATURE_STROKE} strokeWidth={heavy ? 1.6 : 1} vectorEffect="non-scaling-stroke" />
                ) : (
                  <polyline points={pts} fill="none" stroke={FEATURE_STROKE} strokeWidth={heavy ? 2 : 1.2} strokeDasharray={f.kind === 'path' ? '6 3' : undefined} vectorEffect="non-scaling-stroke" />
                )}
                <text x={sx(centre.x)} y={sy(centre.y)} fontSize={font * 0.75} textAnchor="middle" fill={FEATURE_LABEL} fontStyle="italic" stroke={PAPER} strokeWidth={font * 0.2} paintOrder="stroke">
                  {f.name}
                </text>
              </g>
            );
          })}
        </g>
        {runs.map((run) => {
          const route = run.route!;
          const { point, angleDeg } = midpointOf(route);
          const selected = run.id === selectedRunId;
          // Every run orange (APWA uniform colour code: signal cable); weight and dash tell the kinds apart.
          const spec = !run.isRouteDrawn ? RUN_STROKES.route_not_recorded : RUN_STROKES[runStyleKey(run)];
          return (
            <g
              key={run.id}
              data-run-id={run.id}
              aria-label={`${run.label}: ${depthLabel(run.minDepthM, units)}${run.isAbandoned ? ', abandoned' : ''}`}
              onClick={onSelectRun ? () => onSelectRun(run.id) : undefined}
              style={onSelectRun ? { cursor: 'pointer' } : undefined}
            >
              <title>{`${run.label} (${run.jobTitle}, revision ${run.revision})`}</title>
              <polyline
                points={route.map((p) => `${sx(p.x)},${sy(p.y)}`).join(' ')}
                fill="none"
                stroke={spec.color}
                strokeWidth={Math.max(spec.width * SCREEN_SCALE, 1.5) * (selected ? 1.8 : 1)}
                strokeDasharray={scaleDash(spec.dash, SCREEN_SCALE)}
                strokeLinecap={spec.linecap}
                data-role="run-stroke"
                strokeLinejoin="round"
                vectorEffect="non-scaling-stroke"
              />
              {/* A wide invisible line: easier to tap on a phone. */}
              <polyline points={route.map((p) => `${sx(p.x)},${sy(p.y)}`).join(' ')} fill="none" stroke="transparent" strokeWidth={font * 1.5} />
              <text
                transform={`translate(${sx(point.x)} ${sy(point.y)}) rotate(${angleDeg})`}
                dy={-font * 0.5}
                fontSize={font}
                textAnchor="middle"
                fill={tokens.colorNeutralForeground1}
                stroke={tokens.colorNeutralBackground1}
                strokeWidth={font * 0.25}
                paintOrder="stroke"
                fontWeight={selected ? 'bold' : 'normal'}
              >
                {/* Only the depth on the line: the names are in the list below and in the tooltip. */}
                {`${depthLabel(run.minDepthM, units)}${run.isAbandoned ? ' (abandoned)' : ''}`}
              </text>
            </g>
          );
        })}
        {map.referencePoints.map((p) => (
          <g key={`ref-${p.id}`} aria-label={`Reference point ${p.label}`}>
            {/* A survey-style ring with a cross, in black (never a marking colour). */}
            <circle cx={sx(p.x)} cy={sy(p.y)} r={font * 0.3} fill={PAPER} stroke={REFERENCE_INK} strokeWidth={font * 0.08} />
            <path
              d={`M ${sx(p.x) - font * 0.5} ${sy(p.y)} H ${sx(p.x) + font * 0.5} M ${sx(p.x)} ${sy(p.y) - font * 0.5} V ${sy(p.y) + font * 0.5}`}
              stroke={REFERENCE_INK}
              strokeWidth={font * 0.08}
              data-role="reference-stroke"
            />
            <text x={sx(p.x) + font * 0.6} y={sy(p.y) + font * 0.35} fontSize={font * 0.9} fill={REFERENCE_INK}>
              {p.label}
            </text>
          </g>
        ))}
        {located.map((item) => {
          const p = item.position!;
          const isWall = item.kind === 'wall_entry';
          return (
            <g key={`item-${item.id}`} aria-label={isWall ? `Wall entry ${item.label}` : item.label}>
              {isWall ? (
                <g>
                  {/* As printed: a square half filled along its diagonal (a sleeve through a wall). */}
                  <rect x={sx(p.x) - font * 0.45} y={sy(p.y) - font * 0.45} width={font * 0.9} height={font * 0.9} fill={PAPER} stroke={REFERENCE_INK} strokeWidth={font * 0.08} />
                  <path
                    d={`M ${sx(p.x) - font * 0.45} ${sy(p.y) - font * 0.45} L ${sx(p.x) - font * 0.45} ${sy(p.y) + font * 0.45} L ${sx(p.x) + font * 0.45} ${sy(p.y) + font * 0.45} Z`}
                    fill={REFERENCE_INK}
                  />
                </g>
              ) : (
                <circle cx={sx(p.x)} cy={sy(p.y)} r={font * 0.35} fill={tokens.colorNeutralForeground1} />
              )}
              <text x={sx(p.x) + font * 0.7} y={sy(p.y) + font * 1.1} fontSize={font * 0.7} fill={tokens.colorNeutralForeground2}>
                {isWall ? `Wall entry: ${item.label}` : item.label}
              </text>
            </g>
          );
        })}
      </svg>
      <figcaption className={styles.legend}>
        <MarkingLegend keys={legendKeys} />
        <span>Each run is labelled with its shallowest recorded depth.</span>
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
