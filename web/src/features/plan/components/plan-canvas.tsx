import { Button, makeStyles, tokens, Tooltip } from '@fluentui/react-components';
import { Add24Regular, ArrowMaximize24Regular, Subtract24Regular } from '@fluentui/react-icons';
import { select } from 'd3-selection';
import { zoom, zoomIdentity, type ZoomBehavior, type ZoomTransform } from 'd3-zoom';
import { useCallback, useEffect, useLayoutEffect, useRef, useState, type MouseEvent as ReactMouseEvent, type PointerEvent as ReactPointerEvent, type ReactNode } from 'react';
import type { PlanPoint } from '@domain/as-built/common.schema';
import type { ItemKind } from '@domain/as-built/item.schema';
import { FEATURE_FILL, FEATURE_LABEL, FEATURE_STROKE, LEADER_INK, PAPER, REFERENCE_INK, WARNING_INK } from '@drawings/marking-palette';

import { landmarkSpots, layoutLabels, type Box, type LabelRequest, type PlacedLabel } from '../utils/label-layout';
import { imagePlanBox, normalizeDegrees, scaleBarFor, type ImagePlacement } from '../utils/plan-geometry';
import type { RunStyle } from '../utils/plan-records';

import { ItemSymbol, ReferenceSymbol, RunLine } from './plan-symbols';
import { CANVAS_BACKGROUND, COMPASS_RING, HALO, MUTED_INK, OVERLAY_PAPER, OVERLAY_PAPER_STRONG, SCREEN_INK, SELECTION, SELECTION_WASH, SHADE } from '../../../config/canvas-theme';

/** What a tap or a drag landed on. */
export type PlanHit =
  | { type: 'item'; id: string }
  | { type: 'reference'; id: string }
  | { type: 'run'; id: string }
  | { type: 'vertex'; index: number }
  | { type: 'segment'; index: number };

export type CanvasItem = { id: string; kind: ItemKind; label: string; x: number; y: number; isSelected: boolean; isDraggable: boolean; hasFinding: boolean };
export type CanvasReference = { id: string; label: string; x: number; y: number; isSelected: boolean };
export type CanvasRun = { id: string; label: string; style: RunStyle; points: PlanPoint[]; isRouteRecorded: boolean; isActive: boolean; badge?: string };
export type CanvasMark = { x: number; y: number; label: string };

/** A site landmark (house, fence …), drawn in muted grey under everything else. */
export type CanvasFeature = { id: string; kind: string; name: string; shape: 'polygon' | 'line'; points: PlanPoint[]; isSelected: boolean };

export type CanvasModel = {
  features?: CanvasFeature[];
  items: CanvasItem[];
  references: CanvasReference[];
  ties: { from: PlanPoint; to: PlanPoint }[];
  runs: CanvasRun[];
  image?: { href: string | undefined; widthPx: number; heightPx: number; placement: ImagePlacement; isProvisional: boolean };
  /** The route being drawn or edited: its points can be dragged, its segments tapped. */
  draftRoute?: { points: PlanPoint[]; selectedIndex: number | undefined; isEditable: boolean; canInsert: boolean };
  marks: CanvasMark[];
  /** A solved position with its accuracy (radius, metres). */
  solution?: { x: number; y: number; accuracyM: number; isWeak: boolean };
  /**
   * Route points placed by a phone's GPS fix (issue 17): drawn as a dashed circle of the fix's accuracy,
   * so a bend from the phone reads as weaker than one taped or drawn.
   */
  gpsBends?: { key: string; x: number; y: number; accuracyM: number; label: string }[];
  showLabels: boolean;
  northAzimuthDeg: number | null;
  lengthSystem: 'metric' | 'imperial';
};

type PlanCanvasProps = {
  model: CanvasModel;
  onTap: (point: PlanPoint, hit: PlanHit | undefined) => void;
  onDragEnd: (hit: PlanHit, point: PlanPoint) => void;
  /** Told the zoom (screen pixels per plan metre) whenever it changes. */
  onZoom?: (pixelsPerMetre: number) => void;
  /** Accessible name of the drawing, e.g. the job title. */
  label: string;
  /** When this changes (a new image, a new scale), everything is brought into view again. */
  fitKey?: string;
  /** What a tap does now, shown over the top of the plan. */
  hint?: ReactNode;
  /** More buttons above the zoom buttons (the layers menu). */
  extraButtons?: ReactNode;
  /** When given, the north arrow can be turned by dragging it; told the new bearing of the plan's top, whole degrees. */
  onNorthTurn?: (northAzimuthDeg: number) => void;
};

const useStyles = makeStyles({
  root: {
    position: 'relative',
    width: '100%',
    height: '100%',
    overflow: 'hidden',
    backgroundColor: CANVAS_BACKGROUND,
    borderRadius: tokens.borderRadiusLarge,
    border: `${tokens.strokeWidthThin} solid ${tokens.colorNeutralStroke2}`,
  },
  svg: { display: 'block', width: '100%', height: '100%', touchAction: 'none', userSelect: 'none', cursor: 'crosshair' },
  zoomButtons: {
    position: 'absolute',
    right: tokens.spacingHorizontalS,
    bottom: tokens.spacingVerticalS,
    display: 'flex',
    flexDirection: 'column',
    gap: tokens.spacingVerticalXS,
  },
  zoomButton: { minWidth: '48px', minHeight: '48px', boxShadow: tokens.shadow4 },
  hint: {
    position: 'absolute',
    top: tokens.spacingVerticalS,
    left: tokens.spacingHorizontalS,
    right: '72px',
    boxSizing: 'border-box',
    minHeight: '44px',
    padding: `${tokens.spacingVerticalS} ${tokens.spacingHorizontalM}`,
    borderRadius: tokens.borderRadiusMedium,
    backgroundColor: OVERLAY_PAPER_STRONG,
    boxShadow: tokens.shadow4,
    color: tokens.colorNeutralForeground1,
    fontSize: tokens.fontSizeBase300,
    lineHeight: tokens.lineHeightBase300,
    pointerEvents: 'none',
  },
});

const HIT_RADIUS_PX = 22;
const FALLBACK_SIZE = { width: 360, height: 480 };
/** Kept between a name and a control laid over the plan, pixels. */
const CONTROL_MARGIN_PX = 4;
/** The north arrow's ring: centre from the top right corner, and radius. */
const NORTH_FROM_RIGHT = 34;
const NORTH_FROM_TOP = 40;
const NORTH_RADIUS = 26;

/** Where the HTML controls over the plan (zoom buttons, hint) were measured, relative to the drawing; undefined until measured. */
type ControlBoxes = { buttons: Box | undefined; hint: Box | undefined };

/**
 * The parts of the frame no name may be placed under: the controls drawn over the plan (north arrow top
 * right, scale bar bottom left) and the HTML ones laid on top (the zoom and layers buttons bottom right,
 * the hint along the top), each with a small margin. Where the HTML ones cannot be measured (no layout,
 * as in jsdom) their box is estimated from the styles below: 48 px buttons, 4 px apart, 8 px from the edges.
 */
function controlBoxes(
  size: { width: number; height: number },
  barPixels: number,
  measured: ControlBoxes | undefined,
  shown: { hint: boolean; buttonCount: number },
): Box[] {
  const grow = (b: Box): Box => ({ left: b.left - CONTROL_MARGIN_PX, top: b.top - CONTROL_MARGIN_PX, right: b.right + CONTROL_MARGIN_PX, bottom: b.bottom + CONTROL_MARGIN_PX });
  const buttons = measured?.buttons ?? { left: size.width - 8 - 48, top: size.height - 8 - shown.buttonCount * 52 + 4, right: size.width - 8, bottom: size.height - 8 };
  const hint = shown.hint ? (measured?.hint ?? { left: 8, top: 8, right: size.width - 72, bottom: 8 + 64 }) : undefined;
  const north = { x: size.width - NORTH_FROM_RIGHT, y: NORTH_FROM_TOP };
  return [
    buttons,
    ...(hint ? [hint] : []),
    { left: north.x - NORTH_RADIUS, top: north.y - NORTH_RADIUS, right: north.x + NORTH_RADIUS, bottom: north.y + NORTH_RADIUS },
    // The scale bar's panel: translate(12, height − 20), rect from (−6, −24), 34 px tall.
    { left: 6, top: size.height - 44, right: 18 + barPixels, bottom: size.height - 10 },
  ].map(grow);
}

function sameBox(a: Box | undefined, b: Box | undefined): boolean {
  if (!a || !b) return a === b;
  return Math.round(a.left) === Math.round(b.left) && Math.round(a.top) === Math.round(b.top) && Math.round(a.right) === Math.round(b.right) && Math.round(a.bottom) === Math.round(b.bottom);
}

function hitOf(target: EventTarget | null): PlanHit | undefined {
  const element = (target as Element | null)?.closest?.('[data-hit]');
  if (!element) return undefined;
  const type = element.getAttribute('data-hit');
  const id = element.getAttribute('data-id') ?? '';
  const index = Number(element.getAttribute('data-index'));
  if (type === 'item' || type === 'reference' || type === 'run') return { type, id };
  if (type === 'vertex' || type === 'segment') return { type, index };
  return undefined;
}

/** Everything drawn, in plan metres: what "fit" brings into view. */
function extentOf(model: CanvasModel): { minX: number; maxX: number; minY: number; maxY: number } {
  const points: PlanPoint[] = [
    ...model.items,
    ...model.references,
    ...model.runs.flatMap((run) => run.points),
    ...(model.draftRoute?.points ?? []),
  ];
  if (model.image) {
    const box = imagePlanBox(model.image.widthPx, model.image.heightPx, model.image.placement);
    points.push(box.topLeft, { x: box.topLeft.x + box.widthM, y: box.topLeft.y - box.heightM });
  }
  if (points.length === 0) return { minX: -10, maxX: 10, minY: -10, maxY: 10 };
  const xs = points.map((p) => p.x);
  const ys = points.map((p) => p.y);
  return { minX: Math.min(...xs), maxX: Math.max(...xs), minY: Math.min(...ys), maxY: Math.max(...ys) };
}

/**
 * The plan in plan metres (+y up), panned and zoomed with d3-zoom: wheel, drag, pinch, and the +/−/fit
 * buttons. Symbols, labels and tap targets keep their screen size whatever the zoom; a tap reports the
 * plan point and what it landed on, a drag of a draggable item or route point reports where it ended.
 */
export function PlanCanvas({ model, onTap, onDragEnd, onZoom, label, fitKey, hint, extraButtons, onNorthTurn }: PlanCanvasProps) {
  const styles = useStyles();
  const svgRef = useRef<SVGSVGElement>(null);
  const zoomRef = useRef<ZoomBehavior<SVGSVGElement, unknown> | undefined>(undefined);
  const [transform, setTransform] = useState<ZoomTransform>(zoomIdentity);
  const [size, setSize] = useState(FALLBACK_SIZE);
  const sizeRef = useRef(size);
  sizeRef.current = size;
  const [drag, setDrag] = useState<{ hit: PlanHit; pointerId: number; start: { x: number; y: number }; point: PlanPoint; hasMoved: boolean } | undefined>();
  const suppressClick = useRef(false);
  /** Set once the user pans or zooms: from then on the view is theirs, not refitted on resize. */
  const hasUserMoved = useRef(false);
  const hasFitted = useRef(false);
  const modelRef = useRef(model);
  modelRef.current = model;
  const onZoomRef = useRef(onZoom);
  onZoomRef.current = onZoom;

  const buttonsRef = useRef<HTMLDivElement>(null);
  const hintElement = useRef<HTMLDivElement | null>(null);
  const observerRef = useRef<ResizeObserver | undefined>(undefined);
  const [controls, setControls] = useState<ControlBoxes | undefined>(undefined);

  const measure = useCallback(() => {
    const rect = svgRef.current?.getBoundingClientRect();
    if (!rect || rect.width <= 0 || rect.height <= 0) return;
    setSize({ width: rect.width, height: rect.height });
    const boxOf = (element: Element | null): Box | undefined => {
      const b = element?.getBoundingClientRect();
      return b && b.width > 0 && b.height > 0 ? { left: b.left - rect.left, top: b.top - rect.top, right: b.right - rect.left, bottom: b.bottom - rect.top } : undefined;
    };
    const next = { buttons: boxOf(buttonsRef.current), hint: boxOf(hintElement.current) };
    setControls((previous) => (previous && sameBox(previous.buttons, next.buttons) && sameBox(previous.hint, next.hint) ? previous : next));
  }, []);

  useLayoutEffect(() => {
    measure();
    const observer = new ResizeObserver(measure);
    observerRef.current = observer;
    for (const element of [svgRef.current, buttonsRef.current, hintElement.current]) if (element) observer.observe(element);
    return () => {
      observer.disconnect();
      observerRef.current = undefined;
    };
  }, [measure]);

  // The hint comes and goes with the tool and changes height with its text: names keep off it.
  const hintRef = useCallback(
    (element: HTMLDivElement | null) => {
      if (hintElement.current) observerRef.current?.unobserve(hintElement.current);
      hintElement.current = element;
      if (element) observerRef.current?.observe(element);
      measure();
    },
    [measure],
  );

  useEffect(() => {
    const svg = svgRef.current;
    if (!svg) return;
    const behavior = zoom<SVGSVGElement, unknown>()
      .scaleExtent([0.05, 5000])
      // The measured size, not the SVG's width attribute (which d3 would read by default).
      .extent(() => [
        [0, 0],
        [sizeRef.current.width, sizeRef.current.height],
      ])
      // A drag that starts on an item or route point moves it; everywhere else it pans.
      .filter((event: Event & { button?: number; ctrlKey?: boolean; target: EventTarget | null }) => {
        if ((event.ctrlKey === true && event.type !== 'wheel') || (event.button ?? 0) !== 0) return false;
        return !(event.target as Element | null)?.closest?.('[data-drag="true"]');
      })
      .on('zoom', (event: { transform: ZoomTransform; sourceEvent: Event | null }) => {
        if (event.sourceEvent) hasUserMoved.current = true;
        setTransform(event.transform);
        onZoomRef.current?.(event.transform.k);
      });
    zoomRef.current = behavior;
    select(svg).call(behavior).on('dblclick.zoom', null);
    return () => {
      select(svg).on('.zoom', null);
    };
  }, []);

  const fit = useCallback(() => {
    const svg = svgRef.current;
    const behavior = zoomRef.current;
    if (!svg || !behavior) return;
    const e = extentOf(modelRef.current);
    // Clear of the hint on top and the buttons on the right, with room for labels on the left.
    const pad = { top: 76, right: 72, bottom: 40, left: 40 };
    // At least 10 m across, so a lone item is not blown up to fill the screen.
    const w = Math.max(e.maxX - e.minX, 10);
    const h = Math.max(e.maxY - e.minY, 10);
    const innerW = Math.max(size.width - pad.left - pad.right, 40);
    const innerH = Math.max(size.height - pad.top - pad.bottom, 40);
    const k = Math.max(0.05, Math.min(innerW / w, innerH / h));
    const cx = (e.minX + e.maxX) / 2;
    const cy = -(e.minY + e.maxY) / 2;
    const centre = { x: pad.left + innerW / 2, y: pad.top + innerH / 2 };
    select(svg).call(behavior.transform, zoomIdentity.translate(centre.x - cx * k, centre.y - cy * k).scale(k));
  }, [size]);

  // Fit once the first content and the real size are known, and again for a new image or scale;
  // other changes keep the user's view.
  const fittedKey = useRef(fitKey);
  const hasImage = model.image !== undefined;
  useEffect(() => {
    if (fittedKey.current !== fitKey) {
      fittedKey.current = fitKey;
      hasFitted.current = false;
      hasUserMoved.current = false;
    }
    // Until the user moves the view, it follows the content and the screen size.
    if (hasFitted.current && hasUserMoved.current) return;
    fit();
    if (model.items.length + model.references.length + model.runs.length > 0 || hasImage) hasFitted.current = true;
  }, [fit, fitKey, model.items.length, model.references.length, model.runs.length, hasImage]);

  const zoomBy = (factor: number) => {
    if (!svgRef.current || !zoomRef.current) return;
    hasUserMoved.current = true;
    zoomRef.current.scaleBy(select(svgRef.current), factor);
  };

  const toPlan = useCallback(
    (clientX: number, clientY: number): PlanPoint => {
      const rect = svgRef.current?.getBoundingClientRect();
      const [wx, wy] = transform.invert([clientX - (rect?.left ?? 0), clientY - (rect?.top ?? 0)]);
      return { x: wx, y: -wy };
    },
    [transform],
  );
  const sx = (x: number) => transform.applyX(x);
  const sy = (y: number) => transform.applyY(-y);

  const handleClick = (event: ReactMouseEvent<SVGSVGElement>) => {
    if (suppressClick.current) {
      suppressClick.current = false;
      return;
    }
    onTap(toPlan(event.clientX, event.clientY), hitOf(event.target));
  };

  const startDrag = (event: ReactPointerEvent<SVGElement>, hit: PlanHit) => {
    if (event.button !== 0) return;
    event.currentTarget.setPointerCapture?.(event.pointerId);
    setDrag({ hit, pointerId: event.pointerId, start: { x: event.clientX, y: event.clientY }, point: toPlan(event.clientX, event.clientY), hasMoved: false });
  };
  const moveDrag = (event: ReactPointerEvent<SVGElement>) => {
    if (!drag || drag.pointerId !== event.pointerId) return;
    const hasMoved = drag.hasMoved || Math.hypot(event.clientX - drag.start.x, event.clientY - drag.start.y) > 6;
    setDrag({ ...drag, point: toPlan(event.clientX, event.clientY), hasMoved });
  };
  const endDrag = (event: ReactPointerEvent<SVGElement>) => {
    if (!drag || drag.pointerId !== event.pointerId) return;
    setDrag(undefined);
    if (drag.hasMoved) {
      // The browser still sends a click for this pointer; it must not count as a tap.
      suppressClick.current = true;
      window.setTimeout(() => {
        suppressClick.current = false;
      }, 400);
      onDragEnd(drag.hit, toPlan(event.clientX, event.clientY));
    }
  };
  const dragHandlers = (hit: PlanHit) => ({
    'data-drag': 'true',
    onPointerDown: (event: ReactPointerEvent<SVGElement>) => startDrag(event, hit),
    onPointerMove: moveDrag,
    onPointerUp: endDrag,
    onPointerCancel: () => setDrag(undefined),
  });

  const [isTurning, setIsTurning] = useState(false);
  const northCentre = { x: size.width - NORTH_FROM_RIGHT, y: NORTH_FROM_TOP };
  const turnTo = (event: ReactPointerEvent<SVGElement>) => {
    const rect = svgRef.current?.getBoundingClientRect();
    const dx = event.clientX - (rect?.left ?? 0) - northCentre.x;
    const dy = event.clientY - (rect?.top ?? 0) - northCentre.y;
    if (Math.hypot(dx, dy) < 4) return;
    // The arrow points at screen angle θ (clockwise from up) = −bearing of the plan's top.
    const theta = (Math.atan2(dx, -dy) * 180) / Math.PI;
    onNorthTurn?.(normalizeDegrees(Math.round(-theta)));
  };
  const northHandlers = onNorthTurn
    ? {
        'data-drag': 'true',
        pointerEvents: 'all',
        style: { cursor: 'grab' },
        onPointerDown: (event: ReactPointerEvent<SVGElement>) => {
          event.currentTarget.setPointerCapture?.(event.pointerId);
          setIsTurning(true);
          turnTo(event);
        },
        onPointerMove: (event: ReactPointerEvent<SVGElement>) => {
          if (isTurning) turnTo(event);
        },
        onPointerUp: () => {
          setIsTurning(false);
          suppressClick.current = true;
          window.setTimeout(() => {
            suppressClick.current = false;
          }, 400);
        },
        onPointerCancel: () => setIsTurning(false),
      }
    : { pointerEvents: 'none' };

  const isDragging = (hit: PlanHit) =>
    drag?.hasMoved === true && drag.hit.type === hit.type && ('id' in hit ? 'id' in drag.hit && drag.hit.id === hit.id : 'index' in drag.hit && drag.hit.index === hit.index);
  const draftPoints = (model.draftRoute?.points ?? []).map((p, index) => (isDragging({ type: 'vertex', index }) ? drag!.point : p));
  const items = model.items.map((item) => (isDragging({ type: 'item', id: item.id }) ? { ...item, ...drag!.point } : item));
  const pixelsPerMetre = transform.k;
  const bar = scaleBarFor(pixelsPerMetre, Math.min(140, size.width / 3), model.lengthSystem);
  // Item names first (they are the job's record), then reference points, then landmarks (they only
  // orient the reader, and their shape shows without a name); each where it is clear of the others, of
  // every symbol and of the controls over the plan, or left off until a zoom makes room (the selected
  // item's or landmark's always shows).
  const labelRequests: LabelRequest[] = [
    ...items.map((item) => ({ id: `item:${item.id}`, x: sx(item.x), y: sy(item.y), text: item.label, fontSize: 12, isPinned: item.isSelected })),
    ...model.references.map((ref) => ({ id: `ref:${ref.id}`, x: sx(ref.x), y: sy(ref.y), text: ref.label, fontSize: 12 })),
    ...(model.features ?? []).map((f) => ({
      id: `feature:${f.id}`,
      text: f.name,
      fontSize: 12,
      isPinned: f.isSelected,
      spots: landmarkSpots(
        f.shape,
        f.points.map((p) => ({ x: sx(p.x), y: sy(p.y) })),
        { text: f.name, fontSize: 12 },
        size,
      ),
    })),
  ];
  const labels = model.showLabels
    ? layoutLabels(labelRequests, size, {
        blocked: controlBoxes(size, bar.pixels, controls, { hint: Boolean(hint), buttonCount: extraButtons ? 4 : 3 }),
        lines: model.runs.map((run) => run.points.map((p) => ({ x: sx(p.x), y: sy(p.y) }))),
      })
    : new Map<string, PlacedLabel>();
  const image = model.image;
  const imageBox = image ? imagePlanBox(image.widthPx, image.heightPx, image.placement) : undefined;

  return (
    <div className={styles.root}>
      <svg
        ref={svgRef}
        className={styles.svg}
        role="application"
        aria-label={label}
        data-transform={`${transform.k} ${transform.x} ${transform.y}`}
        onClick={handleClick}
      >
        {image && imageBox && image.href && (
          <image
            href={image.href}
            x={sx(imageBox.topLeft.x)}
            y={sy(imageBox.topLeft.y)}
            width={imageBox.widthM * transform.k}
            height={imageBox.heightM * transform.k}
            preserveAspectRatio="none"
            opacity={image.isProvisional ? 0.9 : 0.75}
            data-testid="plan-image"
          />
        )}
        <g data-layer="features">
          {(model.features ?? []).map((f) => {
            const pts = f.points.map((p) => `${sx(p.x)},${sy(p.y)}`).join(' ');
            const width = (f.kind === 'fence' || f.kind === 'wall' || f.kind === 'house' ? 2 : 1.3) * (f.isSelected ? 2 : 1);
            return (
              <g key={f.id} data-feature-id={f.id} role="graphics-symbol" aria-label={f.name}>
                {f.shape === 'polygon' ? (
                  <polygon points={pts} fill={FEATURE_FILL} fillOpacity={0.7} stroke={FEATURE_STROKE} strokeWidth={width} />
                ) : (
                  <polyline points={pts} fill="none" stroke={FEATURE_STROKE} strokeWidth={width + 1} strokeDasharray={f.kind === 'path' ? '8 4' : undefined} />
                )}
              </g>
            );
          })}
        </g>
        <g data-layer="ties">
          {model.ties.map((tie, i) => (
            <line key={i} x1={sx(tie.from.x)} y1={sy(tie.from.y)} x2={sx(tie.to.x)} y2={sy(tie.to.y)} stroke={REFERENCE_INK} strokeWidth={1.2} strokeDasharray="8 3 2 3" />
          ))}
        </g>
        <g data-layer="runs">
          {model.runs.map((run) => {
            const screen = run.points.map((p) => ({ x: sx(p.x), y: sy(p.y) }));
            return (
              <g key={run.id} data-run-id={run.id} opacity={run.isActive ? 0.25 : 1}>
                <RunLine style={run.style} points={screen} isRouteRecorded={run.isRouteRecorded} />
                <polyline points={screen.map((p) => `${p.x},${p.y}`).join(' ')} fill="none" stroke="transparent" strokeWidth={HIT_RADIUS_PX} data-hit="run" data-id={run.id} />
              </g>
            );
          })}
        </g>
        {model.solution && Number.isFinite(model.solution.accuracyM) && (
          <g data-layer="solution">
            <circle
              cx={sx(model.solution.x)}
              cy={sy(model.solution.y)}
              r={Math.max(model.solution.accuracyM * transform.k, 4)}
              fill={SHADE}
              stroke={LEADER_INK}
              strokeWidth={model.solution.isWeak ? 3 : 1.5}
              strokeDasharray={model.solution.isWeak ? '3 3' : '6 3'}
              data-testid="accuracy-circle"
            />
            <circle cx={sx(model.solution.x)} cy={sy(model.solution.y)} r={4} fill={LEADER_INK} />
          </g>
        )}
        {(model.gpsBends ?? []).length > 0 && (
          <g data-layer="gps-bends" pointerEvents="none">
            {model.gpsBends!.map((bend) => (
              <g key={bend.key} role="graphics-symbol" aria-label={bend.label} data-role="gps-bend">
                <circle
                  cx={sx(bend.x)}
                  cy={sy(bend.y)}
                  r={Math.max(bend.accuracyM * transform.k, 8)}
                  fill={SHADE}
                  stroke={LEADER_INK}
                  strokeWidth={1.5}
                  strokeDasharray="3 3"
                />
                <circle cx={sx(bend.x)} cy={sy(bend.y)} r={3} fill={LEADER_INK} />
              </g>
            ))}
          </g>
        )}
        {/* Landmarks' names over the runs (a name prefers a spot no run crosses), under items and reference
            points; hidden from assistive technology, which reads each landmark's own name above. */}
        <g data-layer="feature-names" pointerEvents="none" aria-hidden="true">
          {(model.features ?? []).map((f) => {
            const placed = labels.get(`feature:${f.id}`);
            return (
              placed && (
                <text key={f.id} data-name-of={f.id} {...placed} fontSize={12} fontStyle="italic" fill={FEATURE_LABEL} stroke={HALO} strokeWidth={3} paintOrder="stroke">
                  {f.name}
                </text>
              )
            );
          })}
        </g>
        <g data-layer="reference-points">
          {model.references.map((ref) => (
            <g key={ref.id} data-hit="reference" data-id={ref.id} role="graphics-symbol" aria-label={`Reference point ${ref.label}`}>
              <circle cx={sx(ref.x)} cy={sy(ref.y)} r={HIT_RADIUS_PX} fill="transparent" />
              <ReferenceSymbol x={sx(ref.x)} y={sy(ref.y)} isSelected={ref.isSelected} />
              {labels.has(`ref:${ref.id}`) && (
                <text {...labels.get(`ref:${ref.id}`)} fontSize={12} fill={REFERENCE_INK} stroke={HALO} strokeWidth={3} paintOrder="stroke">
                  {ref.label}
                </text>
              )}
            </g>
          ))}
        </g>
        <g data-layer="items">
          {items.map((item) => (
            <g
              key={item.id}
              data-hit="item"
              data-id={item.id}
              // ARIA allows aria-label only on an element with a role (axe: aria-prohibited-attr); the
              // name must not depend on the label being drawn (a crowded plan leaves some off).
              role="graphics-symbol"
              aria-label={`${item.label}`}
              {...(item.isDraggable ? dragHandlers({ type: 'item', id: item.id }) : {})}
              style={item.isDraggable ? { cursor: 'grab' } : undefined}
            >
              <circle cx={sx(item.x)} cy={sy(item.y)} r={HIT_RADIUS_PX} fill="transparent" />
              <ItemSymbol kind={item.kind} x={sx(item.x)} y={sy(item.y)} isSelected={item.isSelected} />
              {item.hasFinding && <circle cx={sx(item.x) + 11} cy={sy(item.y) - 11} r={5} fill={WARNING_INK} stroke={PAPER} strokeWidth={1.5} />}
              {labels.has(`item:${item.id}`) && (
                <text {...labels.get(`item:${item.id}`)} fontSize={12} fontWeight={600} fill={SCREEN_INK} stroke={HALO} strokeWidth={3} paintOrder="stroke">
                  {item.label}
                </text>
              )}
            </g>
          ))}
        </g>
        {model.showLabels && (
          <g data-layer="run-badges">
            {model.runs
              .filter((run) => run.badge && run.points.length >= 2)
              .map((run) => {
                const mid = run.points[Math.floor((run.points.length - 1) / 2)]!;
                const next = run.points[Math.floor((run.points.length - 1) / 2) + 1] ?? mid;
                const x = sx((mid.x + next.x) / 2);
                const y = sy((mid.y + next.y) / 2);
                return (
                  <g key={run.id} data-badge-for={run.id}>
                    <rect x={x - 4} y={y - 22} width={run.badge!.length * 6.6 + 12} height={20} rx={10} fill={PAPER} stroke={WARNING_INK} />
                    <text x={x + 2} y={y - 8} fontSize={11} fill={WARNING_INK}>
                      {run.badge}
                    </text>
                  </g>
                );
              })}
          </g>
        )}
        {model.draftRoute && (
          <g data-layer="draft-route">
            <polyline
              points={draftPoints.map((p) => `${sx(p.x)},${sy(p.y)}`).join(' ')}
              fill="none"
              stroke={SELECTION}
              strokeWidth={4}
              strokeLinejoin="round"
              data-testid="draft-route"
              data-points={draftPoints.length}
            />
            {model.draftRoute.canInsert &&
              draftPoints.slice(0, -1).map((p, index) => {
                const q = draftPoints[index + 1]!;
                return (
                  <line
                    key={`s${index}`}
                    x1={sx(p.x)}
                    y1={sy(p.y)}
                    x2={sx(q.x)}
                    y2={sy(q.y)}
                    stroke="transparent"
                    strokeWidth={HIT_RADIUS_PX}
                    data-hit="segment"
                    data-index={index}
                  />
                );
              })}
            {draftPoints.map((p, index) => (
              <g
                key={`v${index}`}
                data-hit="vertex"
                data-index={index}
                aria-label={`Route point ${index + 1}`}
                {...(model.draftRoute!.isEditable ? dragHandlers({ type: 'vertex', index }) : {})}
              >
                <circle cx={sx(p.x)} cy={sy(p.y)} r={HIT_RADIUS_PX} fill="transparent" />
                <circle
                  cx={sx(p.x)}
                  cy={sy(p.y)}
                  r={model.draftRoute!.selectedIndex === index ? 10 : 7}
                  fill={model.draftRoute!.selectedIndex === index ? SELECTION : HALO}
                  stroke={SELECTION}
                  strokeWidth={3}
                />
              </g>
            ))}
          </g>
        )}
        <g data-layer="marks">
          {model.marks.map((mark) => (
            <g key={mark.label} data-mark={mark.label}>
              <circle cx={sx(mark.x)} cy={sy(mark.y)} r={12} fill={SELECTION_WASH} stroke={SELECTION} strokeWidth={3} />
              <line x1={sx(mark.x) - 18} y1={sy(mark.y)} x2={sx(mark.x) + 18} y2={sy(mark.y)} stroke={SELECTION} strokeWidth={1.5} />
              <line x1={sx(mark.x)} y1={sy(mark.y) - 18} x2={sx(mark.x)} y2={sy(mark.y) + 18} stroke={SELECTION} strokeWidth={1.5} />
              <text x={sx(mark.x) + 16} y={sy(mark.y) - 14} fontSize={16} fontWeight={700} fill={SELECTION} stroke={HALO} strokeWidth={3} paintOrder="stroke">
                {mark.label}
              </text>
            </g>
          ))}
        </g>
        <g data-layer="scale-bar" transform={`translate(12, ${size.height - 20})`} pointerEvents="none">
          <rect x={-6} y={-24} width={bar.pixels + 12} height={34} rx={4} fill={OVERLAY_PAPER} />
          <rect x={0} y={0} width={bar.pixels / 2} height={5} fill={SCREEN_INK} />
          <rect x={bar.pixels / 2} y={0} width={bar.pixels / 2} height={5} fill={HALO} stroke={SCREEN_INK} strokeWidth={1} />
          <text x={0} y={-8} fontSize={12} fill={SCREEN_INK} data-testid="scale-bar-label">
            {bar.label}
          </text>
        </g>
        <g data-layer="north-arrow" transform={`translate(${northCentre.x}, ${northCentre.y})`} {...northHandlers} role={onNorthTurn ? 'graphics-symbol' : undefined} aria-label={onNorthTurn ? 'Turn the north arrow' : undefined}>
          <circle r={NORTH_RADIUS} fill={OVERLAY_PAPER} stroke={onNorthTurn ? SELECTION : COMPASS_RING} strokeWidth={onNorthTurn ? 3 : 1} />
          {model.northAzimuthDeg === null ? (
            <text textAnchor="middle" y={4} fontSize={10} fill={MUTED_INK}>
              North?
            </text>
          ) : (
            // Plan +y points at bearing `northAzimuthDeg`: true north is that many degrees anticlockwise of up.
            <g transform={`rotate(${-model.northAzimuthDeg})`} data-testid="north-arrow">
              <polygon points="0,-20 7,8 0,3 -7,8" fill={SCREEN_INK} />
              <text textAnchor="middle" y={19} fontSize={10} fontWeight={700} fill={SCREEN_INK}>
                N
              </text>
            </g>
          )}
        </g>
      </svg>
      {hint && (
        <div ref={hintRef} className={styles.hint} role="status" aria-live="polite" data-testid="plan-hint">
          {hint}
        </div>
      )}
      <div ref={buttonsRef} className={styles.zoomButtons}>
        {extraButtons}
        <Tooltip content="Zoom in" relationship="label">
          <Button className={styles.zoomButton} icon={<Add24Regular />} onClick={() => zoomBy(1.6)} />
        </Tooltip>
        <Tooltip content="Zoom out" relationship="label">
          <Button className={styles.zoomButton} icon={<Subtract24Regular />} onClick={() => zoomBy(1 / 1.6)} />
        </Tooltip>
        <Tooltip content="Show everything" relationship="label">
          <Button
            className={styles.zoomButton}
            icon={<ArrowMaximize24Regular />}
            onClick={() => {
              hasUserMoved.current = false;
              fit();
            }}
          />
        </Tooltip>
      </div>
    </div>
  );
}
