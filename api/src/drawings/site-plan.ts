import type { Container, Svg } from '@svgdotjs/svg.js';

import type { AsBuiltAnalysis } from '../domain/analysis/analyze.js';
import type { AsBuilt } from '../domain/as-built/as-built.schema.js';
import type { ItemKind } from '../domain/as-built/item.schema.js';
import type { SitePlanOptions, TitleBlockInfo } from './drawing-options.js';
import { trimNumber } from '../domain/format/length.js';
import { formatScale, paperName } from './paper.js';
import { BASELINE_EM, LABEL_PAD_PT, LINE_HEIGHT_EM, wrapText, type Box } from './text-box.js';
import { layoutSitePlan, type RunStyleKey, type SitePlanModel } from './site-plan-layout.js';
import { drawAccuracyCircle, drawFeature, drawItemSymbol, drawReferenceSymbol, drawRunLine, drawShallowMarker, drawTieLine } from './site-plan-symbols.js';
import { addText, r2 } from './svg-canvas.js';
import { drawingColourKey, FEATURE_LABEL, LEADER_INK, legendText, MARKING_LEGEND, REFERENCE_INK, type LegendKey } from './marking-palette.js';

export const SITE_PLAN_NOTE = 'Positions are as recorded; verify by hand-digging before any excavation.';
const LOCATE_NOTE = 'Private low-voltage lines are not marked by public one-call locating services.';

const LEGEND = MARKING_LEGEND;

/** Keys of the legend entries the model actually draws, in legend order. */
export function sitePlanLegendKeys(model: SitePlanModel): LegendKey[] {
  const present = new Set<LegendKey>();
  for (const item of model.items) present.add(item.kind);
  if (model.references.length > 0) present.add('reference_point');
  if (model.features.length > 0) present.add('feature');
  if (model.ties.length > 0) present.add('tie');
  if (model.accuracy.length > 0) present.add('accuracy');
  for (const run of model.runs) {
    if (run.isRouteRecorded) present.add(`run:${run.style}`);
    else present.add('route_not_recorded');
    if (run.shallow.length > 0) present.add('shallow');
  }
  return LEGEND.filter((entry) => present.has(entry.key)).map((entry) => entry.key);
}

/**
 * Draws the site plan of a job as a standalone SVG sized to the printable area of a Letter or A4 sheet
 * (0.5 in / 12.7 mm margins), at the largest standard scale that fits, or marked "not to scale" when
 * no position is known. The viewBox is in paper points (1/72 in). Deterministic: the same input gives
 * the same string.
 */
export function drawSitePlan(asBuilt: AsBuilt, analysis: AsBuiltAnalysis, options: SitePlanOptions): string {
  const model = layoutSitePlan(asBuilt, analysis, options);
  return renderSitePlan(model, options);
}

export function renderSitePlan(model: SitePlanModel, options: SitePlanOptions): string {
  const canvas: Svg = options.createCanvas();
  canvas.attr({
    width: model.area.widthAttr,
    height: model.area.heightAttr,
    'data-drawing': model.sheet === 'ties' ? 'ties' : 'site-plan',
    'data-orientation': model.area.orientation,
  });
  canvas.viewbox(0, 0, r2(model.area.widthPt), r2(model.area.heightPt));
  canvas.rect(r2(model.area.widthPt), r2(model.area.heightPt)).fill('#ffffff');

  // The plan itself, clipped to its frame by a nested viewport.
  const f = model.frame;
  const plan = canvas.nested().attr({ x: r2(f.x), y: r2(f.y), width: r2(f.width), height: r2(f.height), 'data-layer': 'plan' });
  plan.viewbox(r2(f.x), r2(f.y), r2(f.width), r2(f.height));
  if (model.image !== null) {
    const b = model.image.box;
    plan.element('image').attr({
      href: model.image.href,
      x: r2(b.x),
      y: r2(b.y),
      width: r2(b.width),
      height: r2(b.height),
      preserveAspectRatio: 'none',
      opacity: 0.45,
      'data-layer': 'plan-image',
    });
  }
  // Site features first, in muted grey: everything else is drawn over them.
  const featureLayer = plan.group().attr('data-layer', 'features');
  for (const feature of model.features) drawFeature(featureLayer, feature).attr({ 'data-id': feature.featureId, 'data-kind': 'feature', 'data-feature-kind': feature.kind });
  const ties = plan.group().attr('data-layer', 'ties');
  for (const tie of model.ties) drawTieLine(ties, tie.from, tie.to).attr({ 'data-tie': `${tie.itemId}:${tie.referencePointId}` });
  const runs = plan.group().attr('data-layer', 'runs');
  for (const run of model.runs) {
    drawRunLine(runs, run.style, run.points, run.isRouteRecorded).attr({
      'data-id': run.runId,
      'data-kind': 'run',
      'data-style': run.style,
      'data-route': run.isRouteRecorded ? 'recorded' : 'not-recorded',
    });
  }
  const shallow = plan.group().attr('data-layer', 'shallow');
  for (const run of model.runs) {
    for (const s of run.shallow) drawShallowMarker(shallow, s.point).attr({ 'data-shallow-run': run.runId, 'data-station-m': s.stationM });
  }
  const refs = plan.group().attr('data-layer', 'reference-points');
  for (const a of model.accuracy) {
    drawAccuracyCircle(refs, a.centre, a.radiusPt).attr({ 'data-accuracy-for': a.itemId, 'data-accuracy-m': r2(a.accuracyM) });
  }
  for (const ref of model.references) drawReferenceSymbol(refs, ref.point).attr({ 'data-id': ref.referencePointId, 'data-kind': 'reference_point' });
  const items = plan.group().attr('data-layer', 'items');
  for (const item of model.items) drawItemSymbol(items, item.kind, item.point).attr({ 'data-id': item.itemId, 'data-kind': item.kind });

  const labels = plan.group().attr('data-layer', 'labels');
  for (const label of model.labels) {
    if (label.leader !== null) {
      labels
        .line(r2(label.leader.from.x), r2(label.leader.from.y), r2(label.leader.to.x), r2(label.leader.to.y))
        .stroke({ color: LEADER_INK, width: 0.5 });
      labels.circle(2).attr({ cx: r2(label.leader.from.x), cy: r2(label.leader.from.y) }).fill(LEADER_INK);
    }
  }
  for (const label of model.labels) {
    const g = labels.group().attr({
      'data-label-for': label.forId,
      'data-label-kind': label.kind,
      'data-box': `${r2(label.box.x)} ${r2(label.box.y)} ${r2(label.box.width)} ${r2(label.box.height)}`,
    });
    const isTie = label.kind === 'tie';
    label.lines.forEach((line, i) => {
      addText(g, line, label.box.x + LABEL_PAD_PT, label.box.y + LABEL_PAD_PT + label.fontSize * (BASELINE_EM + i * LINE_HEIGHT_EM), {
        size: label.fontSize,
        halo: true,
        weight: label.kind === 'item' || (label.kind === 'run' && i === 0) ? 'bold' : 'normal',
        italic: label.kind === 'reference' || label.kind === 'feature',
        fill: label.kind === 'feature' ? FEATURE_LABEL : REFERENCE_INK,
      });
    });
  }
  drawPlanNotes(plan, model);
  canvas.rect(r2(f.width), r2(f.height)).attr({ x: r2(f.x), y: r2(f.y) }).fill('none').stroke({ color: '#000000', width: 0.8 });

  drawBand(canvas, model, options.titleBlock ?? {}, options.locale);
  return canvas.svg();
}

/** Notes inside the plan frame (top left): not to scale, items and runs not shown, labels left off. */
function drawPlanNotes(parent: Container, model: SitePlanModel): void {
  const g = parent.group().attr('data-layer', 'notes');
  let y = model.frame.y + 12;
  const x = model.frame.x + 6;
  if (model.notToScaleReason !== null) {
    addText(g, 'NOT TO SCALE', x, y, { size: 10, weight: 'bold', halo: true }).attr('data-role', 'not-to-scale');
    y += 10;
    addText(g, model.notToScaleReason, x, y, { size: 6.5, halo: true });
    y += 10;
  }
  if (model.notShown.length > 0) {
    addText(g, 'Not shown on the plan:', x, y, { size: 6.5, weight: 'bold', halo: true });
    y += 8;
    // As many lines as the frame holds; the rest are counted.
    const limit = Math.max(1, Math.floor((model.frame.y + model.frame.height - y - 16) / 8));
    for (const entry of model.notShown.slice(0, limit)) {
      addText(g, `• ${entry.text}`, x, y, { size: 6.5, halo: true }).attr('data-id', entry.id);
      y += 8;
    }
    if (model.notShown.length > limit) {
      addText(g, `… and ${model.notShown.length - limit} more`, x, y, { size: 6.5, halo: true });
      y += 8;
    }
  }
  if (model.omittedLabelCount > 0) {
    addText(g, `${model.omittedLabelCount} label(s) left off for lack of space; see the schedules.`, x, y, { size: 6.5, halo: true, italic: true }).attr(
      'data-role',
      'omitted-labels',
    );
  }
}

function drawBand(canvas: Svg, model: SitePlanModel, info: TitleBlockInfo, locale: string | null | undefined): void {
  const band = model.band;
  const titleW = 210;
  const northW = 110;
  const legendBox: Box = { x: band.x, y: band.y, width: band.width - titleW - northW, height: band.height };
  const northBox: Box = { x: legendBox.x + legendBox.width, y: band.y, width: northW, height: band.height };
  const titleBox: Box = { x: northBox.x + northW, y: band.y, width: titleW, height: band.height };
  for (const b of [legendBox, northBox, titleBox]) {
    canvas.rect(r2(b.width), r2(b.height)).attr({ x: r2(b.x), y: r2(b.y) }).fill('#ffffff').stroke({ color: '#000000', width: 0.8 });
  }
  drawLegend(canvas, model, legendBox, locale);
  drawNorthAndScale(canvas, model, northBox);
  drawTitleBlock(canvas, model, info, titleBox);
}

/** The legend box; its words (the colour key, "gray" features) are spelled for the company's locale. */
function drawLegend(canvas: Svg, model: SitePlanModel, box: Box, locale: string | null | undefined): void {
  const g = canvas.group().attr('data-layer', 'legend');
  addText(g, 'Legend', box.x + 6, box.y + 12, { size: 8, weight: 'bold' });
  addText(g, drawingColourKey(locale), box.x + 40, box.y + 12, { size: 6.5 }).attr('data-role', 'colour-key');
  const keys = sitePlanLegendKeys(model);
  const rowH = 11;
  const rowsPerColumn = Math.max(1, Math.floor((box.height - 22) / rowH));
  const colW = (box.width - 8) / 2;
  keys.forEach((key, i) => {
    const col = Math.floor(i / rowsPerColumn);
    const row = i % rowsPerColumn;
    const x = box.x + 6 + col * colW;
    const y = box.y + 24 + row * rowH;
    const entry = g.group().attr('data-legend', key);
    drawLegendSwatch(entry, key, x, y);
    addText(entry, legendText(key, locale), x + 24, y + 2.3, { size: 6.5 });
  });
}

function drawLegendSwatch(g: Container, key: LegendKey, x: number, y: number): void {
  const c = { x: x + 9, y };
  if (key === 'reference_point') drawReferenceSymbol(g, c);
  else if (key === 'tie') drawTieLine(g, { x: x - 6.5, y }, { x: x + 24.5, y });
  else if (key === 'accuracy') drawAccuracyCircle(g, c, 4.5);
  else if (key === 'shallow') drawShallowMarker(g, c);
  else if (key === 'feature') drawFeature(g, { shape: 'polygon', kind: 'house', points: [{ x, y: y - 3.5 }, { x: x + 18, y: y - 3.5 }, { x: x + 18, y: y + 3.5 }, { x, y: y + 3.5 }] });
  else if (key === 'route_not_recorded') drawRunLine(g, 'direct_burial', [{ x, y }, { x: x + 18, y }], false);
  else if (key.startsWith('run:')) drawRunLine(g, key.slice(4) as RunStyleKey, [{ x, y }, { x: x + 18, y }], true);
  else drawItemSymbol(g, key as ItemKind, c);
}

/** Scale-bar length in the label unit (m or ft): the longest 1-2-5 step whose bar fits `maxPt`. */
export function scaleBarLength(ptPerMetre: number, units: 'metric' | 'imperial', maxPt: number): { value: number; widthPt: number } {
  const ptPerUnit = units === 'metric' ? ptPerMetre : ptPerMetre * 0.3048;
  const maxUnits = maxPt / ptPerUnit;
  let power = 10 ** Math.floor(Math.log10(maxUnits));
  for (;;) {
    for (const m of [5, 2, 1]) {
      if (m * power <= maxUnits) return { value: m * power, widthPt: m * power * ptPerUnit };
    }
    power /= 10;
  }
}

function drawNorthAndScale(canvas: Svg, model: SitePlanModel, box: Box): void {
  const g = canvas.group().attr('data-layer', 'north-and-scale');
  const cx = box.x + box.width / 2;
  const cy = box.y + 40;
  if (model.northAzimuthDeg === null) {
    addText(g, 'North not recorded', cx, cy, { size: 7, anchor: 'middle', italic: true }).attr('data-role', 'north-arrow');
  } else {
    // Plan +y points at bearing `northAzimuthDeg`, so true north is that many degrees anticlockwise of up.
    const rotation = -model.northAzimuthDeg;
    const arrow = g.group().attr({ 'data-role': 'north-arrow', transform: `rotate(${r2(rotation)} ${r2(cx)} ${r2(cy)})` });
    arrow.polygon(`${r2(cx)},${r2(cy - 22)} ${r2(cx + 7)},${r2(cy + 14)} ${r2(cx)},${r2(cy + 8)}`).fill('#000000');
    arrow.polygon(`${r2(cx)},${r2(cy - 22)} ${r2(cx - 7)},${r2(cy + 14)} ${r2(cx)},${r2(cy + 8)}`).fill('#ffffff').stroke({ color: '#000000', width: 0.8 });
    const rad = (rotation * Math.PI) / 180;
    addText(g, 'N', cx + Math.sin(rad) * 30, cy - Math.cos(rad) * 30 + 3.5, { size: 10, weight: 'bold', anchor: 'middle' });
    if (model.northAzimuthDeg !== 0) {
      addText(g, `plan turned ${trimNumber(Math.abs(model.northAzimuthDeg), 1)}° from true north`, cx, box.y + 72, { size: 5.5, anchor: 'middle' });
    }
  }
  const barY = box.y + 98;
  if (model.scale === null) {
    addText(g, 'No scale bar', cx, barY, { size: 7, anchor: 'middle', italic: true });
    return;
  }
  const bar = scaleBarLength(model.ptPerMetre, model.units, box.width - 24);
  const x0 = box.x + (box.width - bar.widthPt) / 2;
  const sg = g.group().attr({ 'data-role': 'scale-bar', 'data-length': bar.value, 'data-width-pt': r2(bar.widthPt) });
  const segments = 4;
  for (let i = 0; i < segments; i += 1) {
    sg.rect(r2(bar.widthPt / segments), 3.5)
      .attr({ x: r2(x0 + (i * bar.widthPt) / segments), y: r2(barY) })
      .fill(i % 2 === 0 ? '#000000' : '#ffffff')
      .stroke({ color: '#000000', width: 0.6 });
  }
  const unit = model.units === 'metric' ? 'm' : 'ft';
  addText(sg, '0', x0, barY + 12, { size: 6.5, anchor: 'middle' });
  addText(sg, trimNumber(bar.value / 2, 2), x0 + bar.widthPt / 2, barY + 12, { size: 6.5, anchor: 'middle' });
  addText(sg, `${trimNumber(bar.value, 2)} ${unit}`, x0 + bar.widthPt, barY + 12, { size: 6.5, anchor: 'middle' });
}

function drawTitleBlock(canvas: Svg, model: SitePlanModel, info: TitleBlockInfo, box: Box): void {
  const g = canvas.group().attr('data-layer', 'title-block');
  const x = box.x + 6;
  let y = box.y + 13;
  addText(g, model.sheet === 'ties' ? 'TIES — taped from reference points' : 'SITE PLAN — buried low-voltage cable', x, y, { size: 8.5, weight: 'bold' }).attr(
    'data-role',
    'sheet-title',
  );
  y += 12;
  const maxChars = Math.floor((box.width - 12) / (7.5 * 0.6));
  for (const line of wrapText(info.title ?? 'Untitled job', maxChars).slice(0, 2)) {
    addText(g, line, x, y, { size: 7.5, weight: 'bold' }).attr('data-role', 'title');
    y += 9.5;
  }
  if (info.subtitle !== undefined) {
    addText(g, wrapText(info.subtitle, Math.floor((box.width - 12) / (7 * 0.6)))[0] ?? '', x, y, { size: 7 });
    y += 9.5;
  }
  const rev = [info.revision !== undefined ? `Revision ${info.revision}` : null, info.date ?? null].filter((s) => s !== null).join(' · ');
  if (rev.length > 0) {
    addText(g, rev, x, y, { size: 7 });
    y += 9.5;
  }
  const scaleText = model.scale === null ? 'Scale: NOT TO SCALE' : `Scale ${formatScale(model.scale)}`;
  addText(g, scaleText, x, y, { size: 7.5, weight: 'bold' }).attr({ 'data-role': 'scale', 'data-ratio': model.scale?.ratio ?? 'nts' });
  y += 9;
  addText(g, model.scale === null ? `${paperName(model.area.paper)} sheet` : `on ${paperName(model.area.paper)}, print at 100 % (no "fit to page")`, x, y, {
    size: 6,
  });
  y += 10;
  for (const line of wrapText(`${SITE_PLAN_NOTE} ${LOCATE_NOTE}`, Math.floor((box.width - 12) / (6.5 * 0.6)))) {
    addText(g, line, x, y, { size: 6.5, weight: 'bold' }).attr('data-role', 'note');
    y += 8;
  }
  if (info.preparedBy !== undefined && y < box.y + box.height - 4) addText(g, `Prepared by ${info.preparedBy}`, x, box.y + box.height - 5, { size: 6 });
}
