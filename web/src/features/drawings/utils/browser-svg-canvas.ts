import { SVG, type Svg } from '@svgdotjs/svg.js';

/**
 * The browser's canvas factory for the shared drawings (`@drawings/*`): a fresh root `<svg>` made by
 * svg.js on the page's own DOM. The server uses svgdom instead (api/src/drawings/node-svg-window.ts).
 */
export function createBrowserSvgCanvas(): Svg {
  return SVG();
}
