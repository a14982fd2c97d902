/** A label the locate map wants to show, in screen pixels, with the spots it may take (tried in order). */
export type MapLabelRequest = {
  id: string;
  text: string;
  /** Never below 12 px on screen. */
  fontSize: number;
  fontWeight?: 'normal' | 'bold';
  /** Lower numbers win: a label is hidden when every spot left for it is taken or out of view. */
  priority: number;
  /** Text baseline positions, each with its anchor. */
  spots: { x: number; y: number; textAnchor: 'start' | 'middle' | 'end' }[];
};

export type MapLabelPlaced = { id: string; text: string; fontSize: number; fontWeight: 'normal' | 'bold'; x: number; y: number; textAnchor: 'start' | 'middle' | 'end'; box: Box };

export type Box = { left: number; top: number; right: number; bottom: number };

export const MIN_LABEL_PX = 12;

/** The web app's UI font (fonts.css): labels are measured in it. */
const FONT_FAMILY = "Inter, 'Segoe UI', system-ui, sans-serif";

/** Only when no canvas is available (jsdom): a generous 0.62 em per character so boxes err large. */
const FALLBACK_EM_PER_CHAR = 0.62;

let context: CanvasRenderingContext2D | null | undefined;

function measuringContext(): CanvasRenderingContext2D | null {
  if (context !== undefined) return context;
  context = null;
  try {
    if (typeof document !== 'undefined' && !/jsdom/i.test(globalThis.navigator?.userAgent ?? '')) {
      context = document.createElement('canvas').getContext('2d');
    }
  } catch {
    context = null;
  }
  return context;
}

/** The advance width of `text` in the shipped UI font, measured by the browser's text shaper (canvas). */
export function textWidth(text: string, fontSize: number, fontWeight: 'normal' | 'bold' = 'normal'): number {
  const ctx = measuringContext();
  if (!ctx) return text.length * fontSize * FALLBACK_EM_PER_CHAR;
  ctx.font = `${fontWeight === 'bold' ? 700 : 400} ${fontSize}px ${FONT_FAMILY}`;
  return ctx.measureText(text).width;
}

export function boxesOverlap(a: Box, b: Box): boolean {
  return a.left < b.right && b.left < a.right && a.top < b.bottom && b.top < a.bottom;
}

/** A label's box: the text's width by its anchor, from the ascent to the descent (plus the 2 px halo). */
export function labelBox(text: string, fontSize: number, fontWeight: 'normal' | 'bold', spot: { x: number; y: number; textAnchor: 'start' | 'middle' | 'end' }): Box {
  const width = textWidth(text, fontSize, fontWeight);
  const left = spot.textAnchor === 'start' ? spot.x : spot.textAnchor === 'end' ? spot.x - width : spot.x - width / 2;
  const halo = 2;
  return { left: left - halo, right: left + width + halo, top: spot.y - fontSize * 0.95 - halo, bottom: spot.y + fontSize * 0.28 + halo };
}

/**
 * Places labels by priority: each takes its first spot that lies wholly inside the view (less `margin`
 * and the `reserved` boxes: scale bar, north arrow, buttons) and clear of every label already placed;
 * a label with no such spot is left out, so labels never overlap and are never clipped.
 */
export function placeMapLabels(
  requests: readonly MapLabelRequest[],
  view: { width: number; height: number },
  reserved: readonly Box[] = [],
): MapLabelPlaced[] {
  const sorted = [...requests].sort((a, b) => a.priority - b.priority);
  const taken: Box[] = [...reserved];
  const placed: MapLabelPlaced[] = [];
  for (const request of sorted) {
    const fontSize = Math.max(MIN_LABEL_PX, request.fontSize);
    const fontWeight = request.fontWeight ?? 'normal';
    for (const spot of request.spots) {
      const box = labelBox(request.text, fontSize, fontWeight, spot);
      if (box.left < 0 || box.top < 0 || box.right > view.width || box.bottom > view.height) continue;
      if (taken.some((t) => boxesOverlap(t, box))) continue;
      taken.push(box);
      placed.push({ id: request.id, text: request.text, fontSize, fontWeight, x: spot.x, y: spot.y, textAnchor: spot.textAnchor, box });
      break;
    }
  }
  return placed;
}
