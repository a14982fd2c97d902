import type { Container, Element, Svg } from '@svgdotjs/svg.js';

/**
 * Creates an empty root `<svg>` element. Drawings never create windows themselves so that the same code
 * runs in the browser (`() => SVG()`) and on the server (`createNodeSvgCanvas` from node-svg-window.ts).
 */
export type SvgCanvasFactory = () => Svg;

export const FONT_FAMILY = 'Inter, sans-serif';

/** Rounds a drawing coordinate to 0.01 pt: keeps output small and byte-identical run to run. */
export function r2(value: number): number {
  const rounded = Math.round(value * 100) / 100;
  return Object.is(rounded, -0) ? 0 : rounded;
}

export function pointsAttr(points: readonly { x: number; y: number }[]): string {
  return points.map((p) => `${r2(p.x)},${r2(p.y)}`).join(' ');
}

export interface TextStyle {
  size: number;
  anchor?: 'start' | 'middle' | 'end';
  weight?: 'normal' | 'bold';
  fill?: string;
  /** White outline behind the glyphs so text stays readable over lines and the plan image. */
  halo?: boolean;
  italic?: boolean;
}

/**
 * Adds one line of text at a baseline position. Uses svg.js `plain()` (which escapes the text through
 * the DOM) and sets x/y directly: svg.js `move()` on text would measure glyphs, which svgdom cannot do
 * without font files.
 */
export function addText(parent: Container, text: string, x: number, y: number, style: TextStyle): Element {
  const el = parent.plain(text);
  const attrs: Record<string, string | number> = {
    x: r2(x),
    y: r2(y),
    'font-size': style.size,
    'font-family': FONT_FAMILY,
  };
  if (style.anchor !== undefined && style.anchor !== 'start') attrs['text-anchor'] = style.anchor;
  if (style.weight === 'bold') attrs['font-weight'] = 'bold';
  if (style.italic === true) attrs['font-style'] = 'italic';
  attrs.fill = style.fill ?? '#000000';
  if (style.halo === true) {
    attrs.stroke = '#ffffff';
    attrs['stroke-width'] = r2(Math.max(1.5, style.size * 0.3));
    attrs['stroke-linejoin'] = 'round';
    attrs['paint-order'] = 'stroke';
  }
  el.attr(attrs);
  return el;
}
