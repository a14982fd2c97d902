import { registerWindow, SVG, type Svg } from '@svgdotjs/svg.js';
import { createSVGWindow } from 'svgdom';

let isRegistered = false;

/**
 * Server-side canvas factory: the only place that imports svgdom. Registers one svgdom window with
 * svg.js on first use and returns a fresh root `<svg>`.
 *
 * svgdom 0.1.25's strict serializer throws "Invalid State Error" on the `xmlns` attribute svg.js sets
 * without a namespace, so it is set again through `setAttributeNS` (VERSIONS.md workaround).
 */
export function createNodeSvgCanvas(): Svg {
  if (!isRegistered) {
    const window = createSVGWindow();
    registerWindow(window, window.document);
    isRegistered = true;
  }
  const canvas = SVG();
  canvas.node.removeAttribute('xmlns');
  canvas.node.setAttributeNS('http://www.w3.org/2000/xmlns/', 'xmlns', 'http://www.w3.org/2000/svg');
  return canvas;
}
