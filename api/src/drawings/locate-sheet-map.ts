import { formatLength, type LengthSystem } from '../domain/format/length.js';
import { mapItemLabel } from '../domain/locate/item-map-label.js';
import type { SiteMap } from '../domain/locate/site-map.schema.js';
import { lineLabelCandidates, lineObstacles, placeLabels, pointLabelCandidates, type LabelRequest } from './label-placement.js';
import { FEATURE_FILL, FEATURE_LABEL, FEATURE_STROKE, INK, PAPER, REFERENCE_INK, RUN_STROKES, runStyleKey } from './marking-palette.js';
import { labelSize, type Box, type Point } from './text-box.js';

/**
 * The locate sheet's map: the site's cumulative buried-cable map (the locate view's) fitted to a box of
 * `widthPt` × `heightPt` print points, with the landmarks in grey, every run orange (APWA uniform colour
 * code: signal cable) with its shallowest depth, the reference points and items in black, every taped tie
 * with its distance, a scale bar in the viewer's units and a north arrow. A plain SVG string: no fonts to
 * load, no script; deterministic for the same input.
 */
export interface LocateSheetMapOptions {
  widthPt: number;
  heightPt: number;
  units: LengthSystem;
}

const PAD = { top: 46, right: 46, bottom: 40, left: 18 };
const RUN_FONT = 7.5;
const SMALL_FONT = 6.5;

/** The longest 1-2-5 step (m or ft) whose bar fits `maxPt`, as the site plan's scale bar chooses it. */
function scaleBar(ptPerMetre: number, units: LengthSystem, maxPt: number): { value: number; widthPt: number } {
  const ptPerUnit = units === 'metric' ? ptPerMetre : ptPerMetre * 0.3048;
  const maxUnits = maxPt / ptPerUnit;
  let power = 10 ** Math.floor(Math.log10(maxUnits));
  for (;;) {
    for (const m of [5, 2, 1]) if (m * power <= maxUnits) return { value: m * power, widthPt: m * power * ptPerUnit };
    power /= 10;
  }
}

function esc(text: string): string {
  return text.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');
}

function n(value: number): string {
  return String(Math.round(value * 100) / 100);
}

/** The run's label on the sheet: its name and shallowest recorded depth. */
export function sheetRunLabel(run: Pick<SiteMap['runs'][number], 'label' | 'minDepthM' | 'isShallow' | 'isAbandoned'>, units: LengthSystem): string {
  const depth = run.minDepthM === null ? 'depth not recorded' : `min ${formatLength(run.minDepthM, units, 'short')}`;
  return `${run.label}: ${depth}${run.isShallow ? ' (SHALLOW)' : ''}${run.isAbandoned ? ' (abandoned)' : ''}`;
}

export function drawLocateSheetMap(map: SiteMap, options: LocateSheetMapOptions): string {
  const { widthPt: W, heightPt: H, units } = options;
  const located = map.items.filter((item) => item.position !== null);
  const runs = map.runs.filter((run) => run.route !== null && run.route.length >= 2);
  const all: Point[] = [
    ...map.siteFeatures.flatMap((f) => f.points),
    ...map.referencePoints,
    ...located.map((i) => i.position!),
    ...runs.flatMap((r) => r.route!),
  ];
  const out: string[] = [];
  out.push(`<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 ${n(W)} ${n(H)}" width="${n(W)}pt" height="${n(H)}pt" data-drawing="locate-sheet-map" font-family="Inter, sans-serif" preserveAspectRatio="xMidYMid meet">`);
  out.push(`<rect x="0.5" y="0.5" width="${n(W - 1)}" height="${n(H - 1)}" fill="${PAPER}" stroke="${INK}" stroke-width="0.75"/>`);
  if (all.length === 0) {
    out.push(`<text x="${n(W / 2)}" y="${n(H / 2)}" font-size="10" text-anchor="middle" fill="${INK}">Nothing on this site has a position on the plan yet.</text></svg>`);
    return out.join('');
  }

  const xs = all.map((p) => p.x);
  const ys = all.map((p) => p.y);
  const minX = Math.min(...xs);
  const maxX = Math.max(...xs);
  const minY = Math.min(...ys);
  const maxY = Math.max(...ys);
  const spanX = Math.max(maxX - minX, 4);
  const spanY = Math.max(maxY - minY, 4);
  const innerW = W - PAD.left - PAD.right;
  const innerH = H - PAD.top - PAD.bottom;
  /** Print points per plan metre. */
  const k = Math.min(innerW / spanX, innerH / spanY);
  const cx = PAD.left + innerW / 2 - ((minX + maxX) / 2) * k;
  const cy = PAD.top + innerH / 2 + ((minY + maxY) / 2) * k;
  const at = (p: Point): Point => ({ x: cx + p.x * k, y: cy - p.y * k });
  const pts = (list: readonly Point[]) => list.map((p) => at(p)).map((p) => `${n(p.x)},${n(p.y)}`).join(' ');

  // Landmarks, grey, under everything.
  out.push('<g data-layer="features">');
  for (const f of map.siteFeatures) {
    const heavy = f.kind === 'fence' || f.kind === 'wall' || f.kind === 'house';
    if (f.shape === 'polygon') out.push(`<polygon points="${pts(f.points)}" fill="${FEATURE_FILL}" stroke="${FEATURE_STROKE}" stroke-width="${heavy ? 1.2 : 0.8}"/>`);
    else out.push(`<polyline points="${pts(f.points)}" fill="none" stroke="${FEATURE_STROKE}" stroke-width="${heavy ? 1.5 : 0.9}"${f.kind === 'path' ? ' stroke-dasharray="4 2"' : ''}/>`);
  }
  out.push('</g>');

  // Ties: dashed black lines from the reference point to the tied item.
  const refs = new Map(map.referencePoints.map((r) => [r.id, r]));
  const ties = located.flatMap((item) =>
    item.ties.flatMap((t) => {
      const ref = refs.get(t.referencePointId);
      return ref ? [{ id: `${item.id}:${ref.id}`, from: at(ref), to: at(item.position!), distanceM: t.distanceM }] : [];
    }),
  );
  out.push('<g data-layer="ties">');
  for (const tie of ties) {
    out.push(`<line x1="${n(tie.from.x)}" y1="${n(tie.from.y)}" x2="${n(tie.to.x)}" y2="${n(tie.to.y)}" stroke="${REFERENCE_INK}" stroke-width="0.6" stroke-dasharray="3 2"/>`);
  }
  out.push('</g>');

  // Runs: orange; kind by weight and dash (marking-palette.ts).
  out.push('<g data-layer="runs">');
  for (const run of runs) {
    const spec = run.isRouteDrawn ? RUN_STROKES[runStyleKey(run)] : RUN_STROKES.route_not_recorded;
    out.push(
      `<polyline data-run-id="${esc(run.id)}" points="${pts(run.route!)}" fill="none" stroke="${spec.color}" stroke-width="${n(spec.width * 1.2)}"${spec.dash ? ` stroke-dasharray="${spec.dash}"` : ''} stroke-linecap="${spec.linecap}" stroke-linejoin="round"/>`,
    );
  }
  out.push('</g>');

  // Reference points (ring and cross) and items (dot; wall entry: half-filled square), black.
  out.push('<g data-layer="symbols">');
  for (const ref of map.referencePoints) {
    const p = at(ref);
    out.push(`<circle cx="${n(p.x)}" cy="${n(p.y)}" r="3.5" fill="${PAPER}" stroke="${REFERENCE_INK}" stroke-width="1"/>`);
    out.push(`<path d="M ${n(p.x - 6)} ${n(p.y)} H ${n(p.x + 6)} M ${n(p.x)} ${n(p.y - 6)} V ${n(p.y + 6)}" stroke="${REFERENCE_INK}" stroke-width="1"/>`);
  }
  for (const item of located) {
    const p = at(item.position!);
    if (item.kind === 'wall_entry') {
      out.push(`<rect x="${n(p.x - 4.5)}" y="${n(p.y - 4.5)}" width="9" height="9" fill="${PAPER}" stroke="${REFERENCE_INK}" stroke-width="1"/>`);
      out.push(`<path d="M ${n(p.x - 4.5)} ${n(p.y - 4.5)} L ${n(p.x - 4.5)} ${n(p.y + 4.5)} L ${n(p.x + 4.5)} ${n(p.y + 4.5)} Z" fill="${REFERENCE_INK}"/>`);
    } else {
      out.push(`<circle cx="${n(p.x)}" cy="${n(p.y)}" r="3" fill="${INK}"/>`);
    }
  }
  out.push('</g>');

  // Labels: runs first (the depth is what matters), then ties, references, items, landmarks.
  type Req = LabelRequest & { text: string; size: number; weight: number; fill: string; italic?: boolean };
  const requests: Req[] = [];
  const bounds = { x: 2, y: 2, width: W - 4, height: H - 4 };
  const label = (id: string, text: string, size: number, priority: number, anchor: Point, preferred: (w: number, h: number) => Point[], style: Partial<Req> = {}) => {
    // Measured in the face it prints in (600 and 700 with the bold advances, which err wide).
    const face = (style.weight ?? 400) >= 600 ? 'bold' : style.italic ? 'italic' : 'regular';
    const { width, height } = labelSize([text], size, () => face);
    requests.push({ id, text, size, weight: 400, fill: INK, width, height, priority, anchor, preferred: preferred(width, height), ...style });
  };
  for (const run of runs) {
    const route = run.route!.map(at);
    label(`run:${run.id}`, sheetRunLabel(run, units), RUN_FONT, run.isShallow ? 100 : 90, route[Math.floor(route.length / 2)]!, (w, h) => lineLabelCandidates(route, w, h), {
      weight: run.isShallow ? 700 : 600,
      ownLines: [run.id],
    });
  }
  for (const tie of ties) {
    const mid = { x: (tie.from.x + tie.to.x) / 2, y: (tie.from.y + tie.to.y) / 2 };
    label(`tie:${tie.id}`, formatLength(tie.distanceM, units, 'long'), SMALL_FONT, 70, mid, (w, h) => lineLabelCandidates([tie.from, tie.to], w, h));
  }
  for (const ref of map.referencePoints) {
    label(`ref:${ref.id}`, ref.label, SMALL_FONT, 60, at(ref), (w, h) => pointLabelCandidates(at(ref), 6, w, h), { weight: 600, italic: true });
  }
  for (const item of located) {
    label(`item:${item.id}`, mapItemLabel(item), SMALL_FONT, 50, at(item.position!), (w, h) => pointLabelCandidates(at(item.position!), 5, w, h));
  }
  for (const f of map.siteFeatures) {
    const centre = f.points.reduce((a, p) => ({ x: a.x + p.x / f.points.length, y: a.y + p.y / f.points.length }), { x: 0, y: 0 });
    label(`feature:${f.id}`, f.name, SMALL_FONT, 10, at(centre), () => [at(centre)], { fill: FEATURE_LABEL, italic: true, allowDisplacement: false });
  }
  const reserved: Box[] = [
    { x: 0, y: H - 38, width: 170, height: 38 },
    { x: W - 52, y: 0, width: 52, height: 60 },
  ];
  const obstacles: Box[] = [
    ...reserved,
    ...map.referencePoints.map((r) => ({ x: at(r).x - 6, y: at(r).y - 6, width: 12, height: 12 })),
    ...located.map((i) => ({ x: at(i.position!).x - 5, y: at(i.position!).y - 5, width: 10, height: 10 })),
  ];
  const soft = runs.flatMap((r) => lineObstacles(r.route!.map(at)));
  // No label lies across a run it does not name (only its own run's line may pass under it).
  const lines = runs.map((r) => ({ id: r.id, points: r.route!.map(at) }));
  const placed = placeLabels(requests, { bounds, obstacles, softObstacles: soft, lines, gap: 1.5, maxRings: 20 });
  const byId = new Map(requests.map((r) => [r.id, r]));
  let leftOff = placed.unplaced.filter((id) => !id.startsWith('feature:')).length;
  out.push('<g data-layer="labels">');
  for (const p of placed.placed) {
    const r = byId.get(p.id)!;
    if (reserved.some((b) => p.box.x < b.x + b.width && b.x < p.box.x + p.box.width && p.box.y < b.y + b.height && b.y < p.box.y + p.box.height)) {
      if (!p.id.startsWith('feature:')) leftOff += 1;
      continue;
    }
    if (p.leader) out.push(`<line x1="${n(p.leader.from.x)}" y1="${n(p.leader.from.y)}" x2="${n(p.leader.to.x)}" y2="${n(p.leader.to.y)}" stroke="#333333" stroke-width="0.4"/>`);
    out.push(
      `<text data-label="${esc(p.id)}" data-box="${[p.box.x, p.box.y, p.box.width, p.box.height].map(n).join(' ')}" x="${n(p.box.x + 1)}" y="${n(p.box.y + 1 + r.size * 0.9)}" font-size="${r.size}" font-weight="${r.weight}"${r.italic ? ' font-style="italic"' : ''} fill="${r.fill}" stroke="${PAPER}" stroke-width="2" paint-order="stroke">${esc(r.text)}</text>`,
    );
  }
  out.push('</g>');
  if (leftOff > 0) {
    // Counted, never silently dropped (every run is also in the sheet's table of runs).
    const note = `${leftOff} label${leftOff === 1 ? '' : 's'} left off: no spot clear of the other runs and labels.`;
    out.push(
      `<text data-role="labels-left-off" x="6" y="12" font-size="${SMALL_FONT}" font-style="italic" fill="${INK}" stroke="${PAPER}" stroke-width="2" paint-order="stroke">${esc(note)}</text>`,
    );
  }

  // Scale bar (bottom left) in the viewer's units, north arrow (top right).
  const bar = scaleBar(k, units, 120);
  const unit = units === 'metric' ? 'm' : 'ft';
  const bx = 12;
  const by = H - 14;
  out.push(`<g data-layer="scale-bar"><rect x="${bx - 5}" y="${by - 17}" width="${n(bar.widthPt + 10)}" height="27" fill="${PAPER}" fill-opacity="0.9"/>`);
  out.push(`<rect x="${bx}" y="${by}" width="${n(bar.widthPt / 2)}" height="4" fill="${INK}"/><rect x="${n(bx + bar.widthPt / 2)}" y="${by}" width="${n(bar.widthPt / 2)}" height="4" fill="${PAPER}" stroke="${INK}" stroke-width="0.6"/>`);
  out.push(`<text x="${bx}" y="${by - 5}" font-size="8" fill="${INK}" data-role="scale-label">${n(bar.value)} ${unit}</text></g>`);
  const nx = W - 26;
  const ny = 30;
  out.push(`<g data-layer="north-arrow" transform="translate(${n(nx)} ${ny})"><circle r="20" fill="${PAPER}" stroke="#8a8886" stroke-width="0.6"/>`);
  out.push(`<g transform="rotate(${n(-map.frame.northAzimuthDeg)})"><polygon points="0,-15 5,6 0,2 -5,6" fill="${INK}"/><text y="15" font-size="8" font-weight="700" text-anchor="middle" fill="${INK}">N</text></g></g>`);
  out.push('</svg>');
  return out.join('');
}
