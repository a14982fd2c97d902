// Screen-only colours of the plan editor, the locate map and the signature pad: what the marking palette
// (@drawings/marking-palette, shared with the printed drawings) has no entry for — selection, overlays on
// the plan, shades. A theme file: components take these names, never literals (eslint.config.js).
// SVG presentation attributes cannot read Fluent's CSS variables, so the values are written out here.
import { PAPER } from '@drawings/marking-palette';

/** Selection, the route being drawn, the calibration mark: Fluent's brand blue (colorBrandStroke1, light). */
export const SELECTION = '#0f6cbd';
/** The fill of the calibration mark's ring. */
export const SELECTION_WASH = 'rgba(15,108,189,0.2)';
/** Behind the plan before its image loads. */
export const CANVAS_BACKGROUND = '#f4f1ea';
/** Halo behind labels on the plan, and symbol fills: the paper of the drawings. */
export const HALO = PAPER;
/** Scale bar, north arrow and item labels on screen. */
export const SCREEN_INK = '#1b1b1b';
/** Secondary text on the plan (the north arrow's caption). */
export const MUTED_INK = '#616161';
/** The north arrow's ring when it is not being turned. */
export const COMPASS_RING = '#8a8886';
/** Panels laid over the plan (scale bar, north arrow, toolbars). */
export const OVERLAY_PAPER = 'rgba(255, 255, 255, 0.85)';
export const OVERLAY_PAPER_STRONG = 'rgba(255, 255, 255, 0.92)';
export const OVERLAY_PAPER_MAP = 'rgba(255, 255, 255, 0.9)';
/** A light shade over the plan (the area being drawn) and the locate map's accuracy circle. */
export const SHADE = 'rgba(0, 0, 0, 0.06)';
export const ACCURACY_SHADE = 'rgba(0,0,0,0.08)';
/** The signature pad's pen: near-black on the white pad. */
export const SIGNATURE_INK = '#111111';
/** White paper behind a printed-style preview (depth profile, e-mail body). */
export const PREVIEW_PAPER = PAPER;
