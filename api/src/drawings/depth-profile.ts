import type { Container } from '@svgdotjs/svg.js';

import type { AsBuiltAnalysis } from '../domain/analysis/analyze.js';
import type { AsBuilt } from '../domain/as-built/as-built.schema.js';
import type { DrawingBaseOptions } from './drawing-options.js';
import { formatDepthLength, formatRuleDepth, trimNumber } from '../domain/format/length.js';
import { depthUnitSymbol, lengthUnitSymbol, niceStep, toAxisDepthUnit, toAxisLengthUnit, type UnitSystem } from './drawing-units.js';
import { lineObstacles, placeLabels, pointLabelCandidates, type LabelRequest } from './label-placement.js';
import { PAPER, RUN_ORANGE, SHALLOW_ZONE_FILL, WARNING_INK } from './marking-palette.js';
import { addText, pointsAttr, r2 } from './svg-canvas.js';
import { BASELINE_EM, LABEL_PAD_PT, labelSize, LINE_HEIGHT_EM, type Box } from './text-box.js';

export interface DepthProfileOptions extends DrawingBaseOptions {
  /** Size on paper, inches; default 3.5 × 1.6 in (several fit on a page). */
  widthIn?: number;
  heightIn?: number;
}

const METHOD_TEXT = {
  direct_burial: 'direct burial',
  conduit: 'in conduit',
  under_hardscape_sleeve: 'sleeve under paving',
  indoor: 'indoor',
} as const;

const BASIS_TEXT = { code: 'code', common_practice: 'common practice', company: 'company rule' } as const;

function truncate(text: string, maxChars: number): string {
  const chars = [...text];
  return chars.length <= maxChars ? text : `${chars.slice(0, Math.max(1, maxChars - 1)).join('')}…`;
}

/**
 * Draws one run's depth profile: station along the run (x, from the run's from-end) against cover below
 * finished grade (y, grade at the top, deeper downward), the readings joined by a line, the required
 * minimum cover from the analysis as a dashed line with its value and basis (full source in a
 * `<title>`), and shallow stations as red triangles with their depth. Sized for several per page.
 * Throws when the run does not exist.
 */
export function drawDepthProfile(asBuilt: AsBuilt, analysis: AsBuiltAnalysis, runId: string, options: DepthProfileOptions): string {
  const run = asBuilt.runs.find((r) => r.id === runId);
  if (run === undefined) throw new Error(`no run with id "${runId}"`);
  const depth = analysis.depth.find((d) => d.runId === runId);
  const result = analysis.runs.find((r) => r.runId === runId);
  const units: UnitSystem = options.units ?? asBuilt.units?.length ?? 'metric';
  const widthIn = options.widthIn ?? 3.5;
  const heightIn = options.heightIn ?? 1.6;
  const W = widthIn * 72;
  const H = heightIn * 72;

  const canvas = options.createCanvas();
  canvas.attr({ width: `${widthIn}in`, height: `${heightIn}in`, 'data-drawing': 'depth-profile', 'data-id': run.id });
  canvas.viewbox(0, 0, r2(W), r2(H));
  canvas.rect(r2(W), r2(H)).fill('#ffffff');

  const title = `${run.isSpare === true ? 'SPARE: ' : ''}${run.isAbandoned === true ? 'ABANDONED: ' : ''}${run.label}`;
  addText(canvas, truncate(title, Math.floor((W - 8) / (7 * 0.6))), 4, 9, { size: 7, weight: 'bold' }).attr('data-role', 'title');
  const sub = `${result?.gaugeLabel ?? ''} · ${run.cableType} · ${METHOD_TEXT[run.method]}`;
  addText(canvas, truncate(sub, Math.floor((W - 8) / (6 * 0.6))), 4, 17, { size: 6 });

  const plot = { left: 34, right: W - 8, top: 27, bottom: H - 17 };
  const readings = [...(run.depthReadings ?? [])].sort((a, b) => a.stationM - b.stationM);
  const minCover = depth?.rule?.minCoverM ?? null;

  if (depth?.status === 'not_buried' || readings.length === 0) {
    const message = depth?.status === 'not_buried' ? 'Indoor run: not buried, no cover applies.' : 'No depth readings recorded for this run.';
    addText(canvas, message, W / 2, (plot.top + plot.bottom) / 2, { size: 7, anchor: 'middle', italic: true }).attr('data-role', 'no-profile');
    canvas.rect(r2(W - 1), r2(H - 1)).attr({ x: 0.5, y: 0.5 }).fill('none').stroke({ color: '#000000', width: 0.5 });
    return canvas.svg();
  }

  // Axes, in the label units (m or ft along; cm or in down).
  const lengthM = Math.max(run.measuredLengthM, ...readings.map((r) => r.stationM));
  const spanX = toAxisLengthUnit(lengthM, units);
  const deepestM = Math.max(...readings.map((r) => r.depthM), minCover ?? 0);
  const stepY = niceStep(toAxisDepthUnit(deepestM, units) * 1.25, 3);
  const spanY = Math.max(stepY, Math.ceil((toAxisDepthUnit(deepestM, units) * 1.2) / stepY) * stepY);
  const sx = (m: number): number => plot.left + (toAxisLengthUnit(m, units) / spanX) * (plot.right - plot.left);
  const sy = (m: number): number => plot.top + (toAxisDepthUnit(m, units) / spanY) * (plot.bottom - plot.top);

  const axes = canvas.group().attr('data-role', 'axes');
  // Too-shallow zone: between grade and the required cover.
  if (minCover !== null && minCover > 0) {
    canvas
      .rect(r2(plot.right - plot.left), r2(sy(minCover) - plot.top))
      .attr({ x: r2(plot.left), y: r2(plot.top), 'data-role': 'shallow-zone' })
      .fill(SHALLOW_ZONE_FILL);
  }
  const stepX = niceStep(spanX, 5);
  for (let v = 0; v <= spanX + 1e-9; v += stepX) {
    const x = plot.left + (v / spanX) * (plot.right - plot.left);
    axes.line(r2(x), r2(plot.bottom), r2(x), r2(plot.bottom + 2.5)).stroke({ color: '#000000', width: 0.5 });
    axes.line(r2(x), r2(plot.top), r2(x), r2(plot.bottom)).stroke({ color: '#dddddd', width: 0.3 });
    addText(axes, trimNumber(v, 2), x, plot.bottom + 9, { size: 5.5, anchor: 'middle' });
  }
  addText(axes, `station from ${truncate(asBuilt.items.find((i) => i.id === run.fromItemId)?.label ?? 'start', 28)}, ${lengthUnitSymbol(units)}`, plot.right, H - 2, {
    size: 5.5,
    anchor: 'end',
    italic: true,
  });
  for (let v = stepY; v <= spanY + 1e-9; v += stepY) {
    const y = plot.top + (v / spanY) * (plot.bottom - plot.top);
    axes.line(r2(plot.left - 2.5), r2(y), r2(plot.left), r2(y)).stroke({ color: '#000000', width: 0.5 });
    axes.line(r2(plot.left), r2(y), r2(plot.right), r2(y)).stroke({ color: '#dddddd', width: 0.3 });
    addText(axes, trimNumber(v, 2), plot.left - 4, y + 2, { size: 5.5, anchor: 'end' });
  }
  addText(axes, `cover, ${depthUnitSymbol(units)}`, 3, plot.bottom + 9, { size: 5.5, italic: true });
  axes.line(r2(plot.left), r2(plot.top), r2(plot.left), r2(plot.bottom)).stroke({ color: '#000000', width: 0.6 });
  // Finished grade: a heavy line with short hatching above it.
  const grade = canvas.group().attr('data-role', 'grade');
  grade.line(r2(plot.left), r2(plot.top), r2(plot.right), r2(plot.top)).stroke({ color: '#000000', width: 1.1 });
  for (let x = plot.left + 4; x < plot.right; x += 6) grade.line(r2(x), r2(plot.top), r2(x + 3), r2(plot.top - 3)).stroke({ color: '#000000', width: 0.4 });
  addText(grade, 'grade', plot.left - 4, plot.top + 2, { size: 5.5, anchor: 'end' });

  const pts = readings.map((r) => ({ x: sx(r.stationM), y: sy(r.depthM) }));
  canvas.polyline(pointsAttr(pts)).fill('none').stroke({ color: RUN_ORANGE, width: 1.2, linejoin: 'round' }).attr('data-role', 'profile');

  // Texts on the plot (required cover, shallow depths) go through the same placement as the site plan.
  const requests: (LabelRequest & { text: string[]; fill: string; role: string })[] = [];
  const FONT = 5.5;
  let coverGroup: Container | null = null;
  if (minCover !== null && depth?.rule !== null && depth?.rule !== undefined) {
    const y = sy(minCover);
    coverGroup = canvas.group().attr({ 'data-role': 'required-cover', 'data-min-cover-m': minCover });
    coverGroup.element('title').words(depth.rule.source);
    coverGroup.line(r2(plot.left), r2(y), r2(plot.right), r2(y)).stroke({ color: WARNING_INK, width: 0.8 }).attr('stroke-dasharray', '4 2');
    const text = [`required cover ${formatRuleDepth(minCover, units)}`, `(${BASIS_TEXT[depth.rule.basis]})`];
    const size = labelSize(text, FONT);
    const above = y - size.height / 2 - 0.5;
    const below = y + size.height / 2 + 0.5;
    const right = plot.right - size.width / 2 - 1;
    const left = plot.left + size.width / 2 + 1;
    requests.push({
      id: 'cover',
      text,
      fill: WARNING_INK,
      role: 'required-cover-label',
      ...size,
      priority: 4,
      allowDisplacement: false,
      anchor: { x: right, y },
      // Along the line, above it first: right end, left end, then in between.
      preferred: [right, left, (left + right) / 2, left + (right - left) / 4, left + ((right - left) * 3) / 4].flatMap((x) => [
        { x, y: above },
        { x, y: below },
      ]),
    });
  } else {
    addText(canvas, 'No depth rule for this method and location', plot.right - 2, plot.top + 8, { size: FONT, anchor: 'end', italic: true });
  }
  const shallow = new Set((depth?.shallowStations ?? []).map((s) => s.readingIndex));
  const marks = canvas.group().attr('data-role', 'readings');
  const markBoxes: Box[] = [];
  (run.depthReadings ?? []).forEach((reading, index) => {
    const x = sx(reading.stationM);
    const y = sy(reading.depthM);
    markBoxes.push({ x: x - 4, y: y - 4, width: 8, height: 8 });
    const isShallow = shallow.has(index);
    const attrs = { 'data-station-m': reading.stationM, 'data-depth-m': reading.depthM, 'data-shallow': String(isShallow) };
    if (isShallow) {
      marks.polygon(pointsAttr([{ x: x - 3.6, y: y - 3 }, { x: x + 3.6, y: y - 3 }, { x, y: y + 3.6 }]))
        .fill(WARNING_INK)
        .stroke({ color: PAPER, width: 0.5 })
        .attr(attrs);
      const text = [`${formatDepthLength(reading.depthM, units)} shallow`];
      const size = labelSize(text, FONT);
      requests.push({
        id: `shallow:${index}`,
        text,
        fill: WARNING_INK,
        role: 'shallow-label',
        ...size,
        priority: 3,
        anchor: { x, y },
        preferred: pointLabelCandidates({ x, y }, 4, size.width, size.height, 1),
      });
    } else {
      marks.circle(3.6).attr({ cx: r2(x), cy: r2(y), ...attrs }).fill('#ffffff').stroke({ color: '#000000', width: 0.7 });
    }
  });
  const placement = placeLabels(requests, {
    bounds: { x: plot.left, y: plot.top + 1, width: plot.right - plot.left, height: plot.bottom - plot.top - 1 },
    obstacles: markBoxes,
    softObstacles: lineObstacles(pts),
    ringStep: 3,
    maxRings: 6,
  });
  for (const placed of placement.placed) {
    const request = requests.find((r) => r.id === placed.id)!;
    const parent = request.id === 'cover' && coverGroup !== null ? coverGroup : marks;
    if (placed.leader !== null) parent.line(r2(placed.leader.from.x), r2(placed.leader.from.y), r2(placed.leader.to.x), r2(placed.leader.to.y)).stroke({ color: '#333333', width: 0.4 });
    const g = parent.group().attr({ 'data-role': request.role, 'data-box': `${r2(placed.box.x)} ${r2(placed.box.y)} ${r2(placed.box.width)} ${r2(placed.box.height)}` });
    request.text.forEach((line, i) => {
      addText(g, line, placed.box.x + LABEL_PAD_PT, placed.box.y + LABEL_PAD_PT + FONT * (BASELINE_EM + i * LINE_HEIGHT_EM), {
        size: FONT,
        fill: request.fill,
        weight: request.role === 'shallow-label' || i === 0 ? 'bold' : 'normal',
        halo: true,
      });
    });
  }
  canvas.rect(r2(W - 1), r2(H - 1)).attr({ x: 0.5, y: 0.5 }).fill('none').stroke({ color: '#000000', width: 0.5 });
  return canvas.svg();
}
