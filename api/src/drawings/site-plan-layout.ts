import type { AsBuiltAnalysis } from '../domain/analysis/analyze.js';
import type { AsBuilt } from '../domain/as-built/as-built.schema.js';
import type { PlanPoint } from '../domain/as-built/common.schema.js';
import type { ItemKind } from '../domain/as-built/item.schema.js';
import type { InstallMethod } from '../domain/as-built/run.schema.js';
import { DEFAULT_LAYERS, type PlanImage, type PlanSheet, type SitePlanLayers, type SitePlanOptions } from './drawing-options.js';
import { formatDepthLength, formatGroundLength } from '../domain/format/length.js';
import type { UnitSystem } from './drawing-units.js';
import { lineLabelAnchor, lineLabelCandidates, lineObstacles, placeLabels, pointLabelCandidates, type LabelRequest, type PlacedLabel } from './label-placement.js';
import { chooseScale, printableArea, ptPerPlanMetre, type DrawingScale, type Orientation, type PrintableArea } from './paper.js';
import { runStyleKey } from './marking-palette.js';
import { labelSize, type Box, type Point } from './text-box.js';

/** Height of the band under the plan that holds the legend, north arrow, scale bar and title block, pt. */
export const BAND_HEIGHT_PT = 144;
export const BAND_GAP_PT = 8;
/** Clear space kept between the outermost plan features and the frame, for their labels, pt. */
const FIT_PAD_X_PT = 48;
const FIT_PAD_Y_PT = 30;
/** Radius of an item symbol, pt. */
export const SYMBOL_RADIUS_PT = 5;

export const ITEM_LABEL_FONT_PT = 7;
export const RUN_LABEL_FONT_PT = 6.5;
export const REF_LABEL_FONT_PT = 6.5;
export const TIE_LABEL_FONT_PT = 6;
export const FEATURE_LABEL_FONT_PT = 6;

export type RunStyleKey = InstallMethod | 'spare' | 'abandoned';

export interface PlanRun {
  runId: string;
  style: RunStyleKey;
  /** Paper points along the run. */
  points: Point[];
  isRouteRecorded: boolean;
  /** Shallow stations, paper points. */
  shallow: { point: Point; stationM: number; depthM: number }[];
}

export interface PlanItem {
  itemId: string;
  kind: ItemKind;
  point: Point;
}

export interface PlanReference {
  referencePointId: string;
  point: Point;
}

export interface PlanTie {
  itemId: string;
  referencePointId: string;
  from: Point;
  to: Point;
  distanceM: number;
}

/** Smallest solved accuracy drawn as a circle, metres: below this the circle would hide in the symbol. */
export const ACCURACY_CIRCLE_MIN_M = 0.05;

/** How far off a position solved from ties may be: a dashed circle of the solver's accuracy radius. */
export interface PlanAccuracy {
  itemId: string;
  centre: Point;
  radiusPt: number;
  accuracyM: number;
}

export type LabelKind = 'item' | 'run' | 'reference' | 'tie' | 'feature';

/** A site feature (house, fence …) in paper points, drawn in muted grey under the runs. */
export interface PlanFeatureShape {
  featureId: string;
  kind: string;
  name: string;
  shape: 'polygon' | 'line';
  points: Point[];
}

export interface PlanLabel extends PlacedLabel {
  kind: LabelKind;
  /** Id of the item, run or reference point the label names (for a tie: the item). */
  forId: string;
  lines: string[];
  fontSize: number;
}

export interface SitePlanModel {
  sheet: PlanSheet;
  area: PrintableArea;
  units: UnitSystem;
  frame: Box;
  band: Box;
  /** The standard scale, or null when the plan is not to scale. */
  scale: DrawingScale | null;
  /** Why the plan is not to scale (null when it is to scale). */
  notToScaleReason: string | null;
  /** Paper points per plan metre (also when not to scale: the factor used to fit the frame). */
  ptPerMetre: number;
  /** Share of the frame's width and height the drawn extent takes (1 = edge to edge, inside the label margins). */
  fill: { width: number; height: number };
  northAzimuthDeg: number | null;
  image: { href: string; box: Box } | null;
  runs: PlanRun[];
  /** Site features (landmarks), in drawing order; not counted in the plan's extent (clipped to the frame). */
  features: PlanFeatureShape[];
  items: PlanItem[];
  references: PlanReference[];
  ties: PlanTie[];
  /** Accuracy circles of positions solved from ties (reference-point layer). */
  accuracy: PlanAccuracy[];
  labels: PlanLabel[];
  /** Labels left off because no free spot was found. */
  omittedLabelCount: number;
  /** Items without a plan position, and runs that cannot be drawn (no route and an end without a position). */
  notShown: { id: string; text: string }[];
  layers: SitePlanLayers;
}

/** The vertex average of an outline: where its name goes. */
function centroidOf(points: readonly Point[]): Point {
  const n = Math.max(points.length, 1);
  return { x: points.reduce((a, p) => a + p.x, 0) / n, y: points.reduce((a, p) => a + p.y, 0) / n };
}

/** Distance along a paper polyline → point, clamped to its ends. */
function pointAlong(points: readonly Point[], distance: number): Point {
  let left = Math.max(0, distance);
  for (let i = 0; i + 1 < points.length; i += 1) {
    const a = points[i]!;
    const b = points[i + 1]!;
    const length = Math.hypot(b.x - a.x, b.y - a.y);
    if (left <= length && length > 0) return { x: a.x + ((b.x - a.x) * left) / length, y: a.y + ((b.y - a.y) * left) / length };
    left -= length;
  }
  return points[points.length - 1] ?? { x: 0, y: 0 };
}

function imagePlanBox(image: PlanImage): { topLeft: PlanPoint; widthM: number; heightM: number } {
  const { imageA, imageB, distanceM, planA } = image.calibration;
  const px = Math.hypot(imageB.x - imageA.x, imageB.y - imageA.y);
  if (!(px > 0) || !(distanceM > 0)) throw new Error('planImage calibration needs two distinct points and a positive distance');
  const mPerPx = distanceM / px;
  const origin = planA ?? { x: 0, y: 0 };
  return {
    topLeft: { x: origin.x - imageA.x * mPerPx, y: origin.y + imageA.y * mPerPx },
    widthM: image.widthPx * mPerPx,
    heightM: image.heightPx * mPerPx,
  };
}

interface SheetFit {
  area: PrintableArea;
  frame: Box;
  band: Box;
  scale: DrawingScale | null;
  notToScaleReason: string | null;
  k: number;
  centre: PlanPoint;
  fill: { width: number; height: number };
}

/**
 * The frame and band of one sheet and the largest standard scale at which the extent fits the frame
 * (inside the label margins), with how much of the frame the drawing then fills.
 */
function fitSheet(extentPoints: readonly PlanPoint[], area: PrintableArea, units: UnitSystem): SheetFit {
  const frame: Box = { x: 0, y: 0, width: area.widthPt, height: area.heightPt - BAND_HEIGHT_PT - BAND_GAP_PT };
  const band: Box = { x: 0, y: area.heightPt - BAND_HEIGHT_PT, width: area.widthPt, height: BAND_HEIGHT_PT };
  const fitW = frame.width - 2 * FIT_PAD_X_PT;
  const fitH = frame.height - 2 * FIT_PAD_Y_PT;
  if (extentPoints.length === 0) {
    return {
      area,
      frame,
      band,
      scale: null,
      notToScaleReason: 'No item has a recorded position: nothing can be shown to scale.',
      k: ptPerPlanMetre(100),
      centre: { x: 0, y: 0 },
      fill: { width: 0, height: 0 },
    };
  }
  const xs = extentPoints.map((p) => p.x);
  const ys = extentPoints.map((p) => p.y);
  const spanX = Math.max(...xs) - Math.min(...xs);
  const spanY = Math.max(...ys) - Math.min(...ys);
  const centre = { x: (Math.min(...xs) + Math.max(...xs)) / 2, y: (Math.min(...ys) + Math.max(...ys)) / 2 };
  const scale = chooseScale(spanX, spanY, fitW, fitH, units);
  const k = scale !== null ? ptPerPlanMetre(scale.ratio) : Math.min(fitW / Math.max(spanX, 1e-9), fitH / Math.max(spanY, 1e-9));
  return {
    area,
    frame,
    band,
    scale,
    notToScaleReason: scale === null ? 'The recorded positions span more than the largest standard scale fits on this sheet.' : null,
    k,
    centre,
    fill: { width: (spanX * k) / fitW, height: (spanY * k) / fitH },
  };
}

/** A larger standard scale wins; at the same scale, the sheet the drawing fills more of (then the first tried). */
function isBetterFit(a: SheetFit, b: SheetFit): boolean {
  if (a.scale !== null && b.scale === null) return true;
  if (a.scale === null || b.scale === null) return false;
  if (a.scale.ratio !== b.scale.ratio) return a.scale.ratio < b.scale.ratio;
  return Math.max(a.fill.width, a.fill.height) > Math.max(b.fill.width, b.fill.height) + 1e-9;
}

/**
 * Lays out the site plan without drawing it: chooses the scale, maps plan metres to paper points,
 * and places every label so that no two overlap. Pure; the SVG is drawn from this model by
 * `drawSitePlan`.
 */
export function layoutSitePlan(asBuilt: AsBuilt, analysis: AsBuiltAnalysis, options: Omit<SitePlanOptions, 'createCanvas'>): SitePlanModel {
  const layers: SitePlanLayers = { ...DEFAULT_LAYERS, ...options.layers };
  const sheet: PlanSheet = options.sheet ?? 'plan';
  // The site plan shows runs, items, depths and landmarks; ties live on their own sheet with the
  // reference points they were taped from.
  const isTies = sheet === 'ties';
  const showReferences = isTies || layers.referencePoints;
  const units: UnitSystem = options.units ?? asBuilt.units?.length ?? 'metric';
  if (options.planImage !== undefined && !options.planImage.href.startsWith('data:')) {
    throw new Error('planImage.href must be a data: URL (a printed packet never fetches from the network)');
  }

  const positions = new Map(analysis.positions.map((p) => [p.itemId, { x: p.x, y: p.y }]));
  const solvedFromTies = analysis.positions.filter(
    (p) => p.source === 'ties' && p.accuracyM !== null && Number.isFinite(p.accuracyM) && p.accuracyM >= ACCURACY_CIRCLE_MIN_M,
  );
  const depthByRun = new Map(analysis.depth.map((d) => [d.runId, d]));
  const runResultById = new Map(analysis.runs.map((r) => [r.runId, r]));
  const notShown: SitePlanModel['notShown'] = [];

  // Which runs are drawn, in plan metres (none on the ties sheet).
  const planRuns: { run: AsBuilt['runs'][number]; points: PlanPoint[]; isRouteRecorded: boolean }[] = [];
  for (const run of isTies ? [] : asBuilt.runs) {
    if (!layers.spareAndAbandoned && (run.isSpare === true || run.isAbandoned === true)) continue;
    if (run.route !== undefined) {
      planRuns.push({ run, points: run.route, isRouteRecorded: true });
      continue;
    }
    const from = positions.get(run.fromItemId);
    const to = positions.get(run.toItemId);
    if (from !== undefined && to !== undefined) planRuns.push({ run, points: [from, to], isRouteRecorded: false });
    else notShown.push({ id: run.id, text: `Run "${run.label}": no route recorded and an end has no position` });
  }
  for (const item of asBuilt.items) {
    if (!positions.has(item.id)) notShown.push({ id: item.id, text: `${item.label}: no position recorded` });
  }

  // Extent of everything drawn, plan metres.
  const extentPoints: PlanPoint[] = [...positions.values(), ...planRuns.flatMap((r) => r.points)];
  if (showReferences) extentPoints.push(...asBuilt.referencePoints);
  const paper = options.paper ?? 'letter';
  const orientations: Orientation[] = options.orientation === 'auto' ? ['portrait', 'landscape'] : [options.orientation ?? 'portrait'];
  let chosen: SheetFit | undefined;
  for (const orientation of orientations) {
    const fit = fitSheet(extentPoints, printableArea(paper, orientation, options.headroomPt ?? 0, options.margins), units);
    if (chosen === undefined || isBetterFit(fit, chosen)) chosen = fit;
  }
  const { area, frame, band, scale, notToScaleReason, k, centre, fill } = chosen!;
  const cx = frame.x + frame.width / 2;
  const cy = frame.y + frame.height / 2;
  const toPaper = (p: PlanPoint): Point => ({ x: cx + (p.x - centre.x) * k, y: cy - (p.y - centre.y) * k });
  const features: PlanFeatureShape[] = (isTies ? [] : (asBuilt.site?.features ?? [])).map((f) => ({
    featureId: f.id,
    kind: f.kind,
    name: f.name,
    shape: f.shape,
    points: f.points.map(toPaper),
  }));

  let image: SitePlanModel['image'] = null;
  if (options.planImage !== undefined) {
    const placed = imagePlanBox(options.planImage);
    const tl = toPaper(placed.topLeft);
    image = { href: options.planImage.href, box: { x: tl.x, y: tl.y, width: placed.widthM * k, height: placed.heightM * k } };
  }

  const runs: PlanRun[] = planRuns.map(({ run, points, isRouteRecorded }) => {
    const paper = points.map(toPaper);
    const shallow: PlanRun['shallow'] = [];
    const depth = depthByRun.get(run.id);
    if (layers.depths && depth !== undefined) {
      for (const s of depth.shallowStations) {
        // Stations are measured along the trench; they are placed along the drawn line at the same distance.
        shallow.push({ point: pointAlong(paper, s.stationM * k), stationM: s.stationM, depthM: s.depthM });
      }
    }
    return { runId: run.id, style: runStyleKey(run), points: paper, isRouteRecorded, shallow };
  });

  const items: PlanItem[] = asBuilt.items.flatMap((item) => {
    const p = positions.get(item.id);
    return p === undefined ? [] : [{ itemId: item.id, kind: item.kind, point: toPaper(p) }];
  });
  const references: PlanReference[] = showReferences
    ? asBuilt.referencePoints.map((rp) => ({ referencePointId: rp.id, point: toPaper(rp) }))
    : [];
  const refById = new Map(asBuilt.referencePoints.map((rp) => [rp.id, rp]));
  const ties: PlanTie[] = [];
  if (isTies) {
    for (const item of asBuilt.items) {
      const p = positions.get(item.id);
      if (p === undefined) continue;
      for (const tie of item.ties ?? []) {
        const rp = refById.get(tie.referencePointId);
        if (rp === undefined) continue;
        ties.push({ itemId: item.id, referencePointId: rp.id, from: toPaper(rp), to: toPaper(p), distanceM: tie.distanceM });
      }
    }
  }

  const accuracy: PlanAccuracy[] = showReferences
    ? solvedFromTies.map((p) => ({ itemId: p.itemId, centre: toPaper(p), radiusPt: p.accuracyM! * k, accuracyM: p.accuracyM! }))
    : [];

  // Labels.
  const requests: (LabelRequest & { kind: LabelKind; forId: string; lines: string[]; fontSize: number })[] = [];
  if (layers.labels) {
    const planItemById = new Map(items.map((i) => [i.itemId, i]));
    for (const item of asBuilt.items) {
      const planItem = planItemById.get(item.id);
      if (planItem === undefined) continue;
      const lines = [item.label];
      const size = labelSize(lines, ITEM_LABEL_FONT_PT, () => 'bold');
      requests.push({
        id: `item:${item.id}`,
        kind: 'item',
        forId: item.id,
        lines,
        fontSize: ITEM_LABEL_FONT_PT,
        ...size,
        priority: 100,
        anchor: planItem.point,
        preferred: pointLabelCandidates(planItem.point, SYMBOL_RADIUS_PT, size.width, size.height),
      });
    }
    const runById = new Map(asBuilt.runs.map((r) => [r.id, r]));
    for (const planRun of runs) {
      const run = runById.get(planRun.runId)!;
      const result = runResultById.get(run.id);
      const depth = depthByRun.get(run.id);
      const prefix = run.isAbandoned === true ? 'ABANDONED: ' : run.isSpare === true ? 'SPARE: ' : '';
      const facts = [result?.gaugeLabel ?? run.cableType];
      // Indoor cable says so whether or not depths are shown: nobody should read it as buried.
      if (run.method === 'indoor') facts.push('indoor, not buried');
      else if (layers.depths && depth !== undefined) {
        if (depth.status === 'not_buried') facts.push('not buried');
        else if (depth.minDepthM !== null) facts.push(`min depth ${formatDepthLength(depth.minDepthM, units)}${depth.shallowStations.length > 0 ? ' (SHALLOW)' : ''}`);
        else facts.push('depth not recorded');
      }
      const lines = [`${prefix}${run.label}`, facts.join(' · '), ...(options.runProvenance?.[run.id] ?? [])];
      if (!planRun.isRouteRecorded) lines.push('route not recorded: straight line shown');
      const size = labelSize(lines, RUN_LABEL_FONT_PT, (i) => (i === 0 ? 'bold' : 'regular'));
      requests.push({
        id: `run:${run.id}`,
        kind: 'run',
        forId: run.id,
        lines,
        fontSize: RUN_LABEL_FONT_PT,
        ...size,
        priority: 80,
        ownLines: [run.id],
        anchor: lineLabelAnchor(planRun.points),
        preferred: lineLabelCandidates(planRun.points, size.width, size.height),
      });
    }
    for (const ref of references) {
      const rp = refById.get(ref.referencePointId)!;
      const lines = [rp.label];
      const size = labelSize(lines, REF_LABEL_FONT_PT, () => 'italic');
      requests.push({
        id: `ref:${rp.id}`,
        kind: 'reference',
        forId: rp.id,
        lines,
        fontSize: REF_LABEL_FONT_PT,
        ...size,
        priority: 70,
        anchor: ref.point,
        preferred: pointLabelCandidates(ref.point, SYMBOL_RADIUS_PT, size.width, size.height),
      });
    }
    // Feature names last: the first to give way when space runs out (never counted as left off).
    for (const feature of features) {
      const lines = [feature.name];
      const size = labelSize(lines, FEATURE_LABEL_FONT_PT, () => 'italic');
      const anchor = feature.shape === 'polygon' ? centroidOf(feature.points) : lineLabelAnchor(feature.points);
      const inFrame = anchor.x > frame.x && anchor.x < frame.x + frame.width && anchor.y > frame.y && anchor.y < frame.y + frame.height;
      if (!inFrame) continue;
      requests.push({
        id: `feature:${feature.featureId}`,
        kind: 'feature',
        forId: feature.featureId,
        lines,
        fontSize: FEATURE_LABEL_FONT_PT,
        ...size,
        priority: 10,
        allowDisplacement: false,
        anchor,
        preferred:
          feature.shape === 'polygon'
            ? [anchor, { x: anchor.x, y: anchor.y - size.height }, { x: anchor.x, y: anchor.y + size.height }]
            : lineLabelCandidates(feature.points, size.width, size.height),
      });
    }
    for (const tie of ties) {
      const lines = [formatGroundLength(tie.distanceM, units)];
      const size = labelSize(lines, TIE_LABEL_FONT_PT);
      const along = [0.5, 0.4, 0.6, 0.3, 0.7, 0.2, 0.8].map((f) => ({ x: tie.from.x + (tie.to.x - tie.from.x) * f, y: tie.from.y + (tie.to.y - tie.from.y) * f }));
      requests.push({
        id: `tie:${tie.itemId}:${tie.referencePointId}`,
        kind: 'tie',
        forId: tie.itemId,
        lines,
        fontSize: TIE_LABEL_FONT_PT,
        ...size,
        priority: 50,
        anchor: along[0]!,
        preferred: along,
      });
    }
  }
  const obstacles: Box[] = [...items.map((i) => i.point), ...references.map((r) => r.point)].map((p) => ({
    x: p.x - SYMBOL_RADIUS_PT - 1,
    y: p.y - SYMBOL_RADIUS_PT - 1,
    width: 2 * SYMBOL_RADIUS_PT + 2,
    height: 2 * SYMBOL_RADIUS_PT + 2,
  }));
  const softObstacles = runs.flatMap((run) => lineObstacles(run.points));
  const inset = 2;
  const placement = placeLabels(requests, {
    bounds: { x: frame.x + inset, y: frame.y + inset, width: frame.width - 2 * inset, height: frame.height - 2 * inset },
    obstacles,
    softObstacles,
    // No label lies across a run it does not name (near a splice a run's label would otherwise sit on
    // the next run, with only its halo between them).
    lines: runs.map((run) => ({ id: run.runId, points: run.points })),
  });
  const requestById = new Map(requests.map((r) => [r.id, r]));
  const labels: PlanLabel[] = placement.placed.map((p) => {
    const r = requestById.get(p.id)!;
    return { ...p, kind: r.kind, forId: r.forId, lines: r.lines, fontSize: r.fontSize };
  });

  return {
    sheet,
    area,
    units,
    frame,
    band,
    scale,
    notToScaleReason,
    ptPerMetre: k,
    fill,
    northAzimuthDeg: asBuilt.site?.northAzimuthDeg ?? null,
    image,
    runs,
    features,
    items,
    references,
    ties,
    accuracy,
    labels,
    omittedLabelCount: placement.unplaced.filter((id) => !id.startsWith('feature:')).length,
    notShown,
    layers,
  };
}
