import { spell } from '../domain/format/date-time.js';

/**
 * The one palette for everything that draws a cable run, a reference point or a site feature: the
 * printed drawings (site plan, schematic, depth profile), the packet PDF and the web app's maps (plan
 * editor, locate view, portal map). Shared with the web as `@drawings/marking-palette`.
 *
 * Source of the colour meanings: the APWA Uniform Color Code for temporary marking of underground
 * facilities, as published by the Common Ground Alliance in the CGA Best Practices (Appendix B):
 *   red     electric power lines, cables, conduit and lighting cables
 *   orange  communication, alarm or signal lines, cables or conduit
 *   yellow  gas, oil, steam, petroleum or gaseous materials
 *   green   sewers and drain lines
 *   blue    potable water
 *   purple  reclaimed water, irrigation and slurry lines
 *   pink    temporary survey markings, unknown or unidentified facilities
 *   white   proposed excavation limits or route
 * Speaker and signal cable is communication / signal cable: ORANGE. The code names colours, not sRGB
 * values; the hex values below are our own screen and print renderings of those names.
 *
 * So: every run is orange, and install method, spare and abandoned runs differ only by dash pattern and
 * weight; reference points, ties and texts are black; site features (house, fences, paths …) are a
 * muted grey under the runs. No other marking colour is ever used for our own lines.
 */

/** Our renderings of the APWA colour names (used by the tests to tell a colour's meaning). */
export const APWA_COLOURS = {
  power: '#d7191c', // red
  communication: '#d35400', // orange
  gas: '#f2c200', // yellow
  sewer: '#1a9641', // green
  water: '#1f5fbf', // blue
  reclaimed: '#7b3294', // purple
  survey: '#e7298a', // pink
  proposedExcavation: '#ffffff', // white
} as const;

export type ApwaUse = keyof typeof APWA_COLOURS;

/** Cable runs: orange, the APWA colour for communication and signal cable. */
export const RUN_ORANGE = APWA_COLOURS.communication;
/** Reference points, ties, tie labels, dimension text: black. */
export const REFERENCE_INK = '#000000';
/** The pink the code gives to survey marks (an alternative for survey reference marks). */
export const SURVEY_PINK = APWA_COLOURS.survey;
/** Site features (house, fences, paths …): muted greys that sit under the runs. */
export const FEATURE_STROKE = '#8a8a8a';
export const FEATURE_FILL = '#ececec';
export const FEATURE_LABEL = '#5c5c5c';
/** Text and symbol ink, leader lines, paper. */
export const INK = '#000000';
export const LEADER_INK = '#333333';
export const PAPER = '#ffffff';
/** Warnings (shallow readings, required cover): black shapes, never a marking colour. */
export const WARNING_INK = '#000000';
/** The too-shallow band of a depth profile (between grade and the required cover): a light grey. */
export const SHALLOW_ZONE_FILL = '#e9e9e9';

export type RunStyleKey = 'direct_burial' | 'conduit' | 'under_hardscape_sleeve' | 'indoor' | 'spare' | 'abandoned';

/**
 * How a run is drawn, on every map and plan: abandoned, spare, or by its installation method. An indoor
 * run keeps the indoor line even when spare or abandoned, because the spare and abandoned lines mean
 * cable in the ground and indoor cable never is (issue 21); its label says spare or abandoned.
 */
export function runStyleKey(run: { method: RunStyleKey; isSpare?: boolean | undefined; isAbandoned?: boolean | undefined }): RunStyleKey {
  if (run.method === 'indoor') return 'indoor';
  if (run.isAbandoned === true) return 'abandoned';
  if (run.isSpare === true) return 'spare';
  return run.method;
}

export interface RunStroke {
  color: string;
  /** Width in print points (scale for screens). */
  width: number;
  /** SVG stroke-dasharray in print points, or undefined for a solid line. */
  dash?: string;
  /** Abandoned runs also carry small crosses along the line, this far apart (points). */
  crossesEvery?: number;
  linecap: 'butt' | 'round';
}

/**
 * Line style per run kind, in print points. Colour is the same for all: what changes is weight and dash.
 * direct burial: medium solid; conduit: heavy solid; sleeve under paving: heavy dash-dot; indoor: thin
 * dash-dot; spare: long dashes; abandoned: thin short dashes with crosses; route not recorded: dots.
 */
export const RUN_STROKES: Readonly<Record<RunStyleKey | 'route_not_recorded', RunStroke>> = {
  direct_burial: { color: RUN_ORANGE, width: 1.6, linecap: 'butt' },
  conduit: { color: RUN_ORANGE, width: 3.2, linecap: 'butt' },
  under_hardscape_sleeve: { color: RUN_ORANGE, width: 3.2, dash: '8 2 2 2', linecap: 'butt' },
  indoor: { color: RUN_ORANGE, width: 0.8, dash: '6 2 1.5 2', linecap: 'butt' },
  spare: { color: RUN_ORANGE, width: 1.4, dash: '7 3', linecap: 'butt' },
  abandoned: { color: RUN_ORANGE, width: 0.8, dash: '3 2', crossesEvery: 14, linecap: 'butt' },
  route_not_recorded: { color: RUN_ORANGE, width: 1.2, dash: '0.1 2.6', linecap: 'round' },
};

/** A dash array scaled from print points to another unit (e.g. screen pixels). */
export function scaleDash(dash: string | undefined, factor: number): string | undefined {
  if (dash === undefined) return undefined;
  return dash
    .split(' ')
    .map((n) => String(Math.round(Number(n) * factor * 100) / 100))
    .join(' ');
}

export type LegendKey =
  | 'amplifier'
  | 'speaker'
  | 'subwoofer'
  | 'junction'
  | 'spare_end'
  | 'wall_entry'
  | 'reference_point'
  | 'tie'
  | 'accuracy'
  | `run:${RunStyleKey}`
  | 'route_not_recorded'
  | 'shallow'
  | 'feature';

/** The words of the legend, the same in the web app's maps, the drawings and the packet PDF. */
export const MARKING_LEGEND: readonly { key: LegendKey; text: string }[] = [
  { key: 'amplifier', text: 'Amplifier' },
  { key: 'speaker', text: 'Speaker' },
  { key: 'subwoofer', text: 'Subwoofer' },
  { key: 'junction', text: 'Splice / junction box' },
  { key: 'spare_end', text: 'Spare cable end' },
  { key: 'wall_entry', text: 'Wall entry' },
  { key: 'reference_point', text: 'Reference point (black)' },
  { key: 'tie', text: 'Tie (taped distance)' },
  { key: 'accuracy', text: 'Possible position (tie accuracy)' },
  { key: 'run:direct_burial', text: 'Cable, direct burial (orange)' },
  { key: 'run:conduit', text: 'Cable in conduit (heavy)' },
  { key: 'run:under_hardscape_sleeve', text: 'Sleeve under paving (heavy dash-dot)' },
  { key: 'run:indoor', text: 'Indoor, not buried (thin dash-dot)' },
  { key: 'run:spare', text: 'Spare run (long dashes)' },
  { key: 'run:abandoned', text: 'Abandoned run, still buried (crosses)' },
  { key: 'route_not_recorded', text: 'Route not recorded (dots)' },
  { key: 'shallow', text: 'Shallow depth reading' },
  { key: 'feature', text: 'House, fence, path … ({gray})' },
];

/** The placeholders of the legend and colour-key words, spelled for the reader's locale. */
function spelled(text: string, locale: string | null | undefined): string {
  return text.replaceAll('{color}', spell('color', locale)).replaceAll('{gray}', spell('gray', locale));
}

/** A legend entry's words, spelled for the company's locale (en-US "gray" by default, en-GB "grey"). */
export function legendText(key: LegendKey, locale?: string | null): string {
  return spelled(MARKING_LEGEND.find((entry) => entry.key === key)!.text, locale);
}

/**
 * The colour sentence printed with every legend (the packet, the web app's maps), spelled for the
 * company's locale: "APWA uniform color code" in en-US (the default), "colour" in en-GB, en-CA, en-AU ….
 */
export function colourKeyNote(locale?: string | null): string {
  return spelled('Orange: buried speaker and signal cable (APWA uniform {color} code). Mark routes on the ground in orange; outline a planned dig area in white.', locale);
}

/** The short colour sentence in a drawing's legend box, spelled for the locale. */
export function drawingColourKey(locale?: string | null): string {
  return spelled('Orange: buried signal cable (APWA {color} code)', locale);
}

function rgb(hex: string): [number, number, number] | null {
  const m = /^#([0-9a-f]{3}|[0-9a-f]{6})$/i.exec(hex.trim());
  if (m === null) return null;
  const h = m[1]!.length === 3 ? [...m[1]!].map((c) => c + c).join('') : m[1]!;
  return [parseInt(h.slice(0, 2), 16), parseInt(h.slice(2, 4), 16), parseInt(h.slice(4, 6), 16)];
}

/**
 * What a colour would say to someone who knows the marking code: the APWA use whose hue it is closest
 * to, 'neutral' for black, greys and near-whites below white (no hue), or 'white' for white itself.
 * Hue bands (our own reading of the named colours, degrees): red < 14 or ≥ 335, orange 14–40,
 * yellow 40–70, green 70–170, blue 170–260, purple 260–300, pink 300–335.
 */
export function markingMeaning(colour: string): ApwaUse | 'neutral' | 'unknown' {
  const c = rgb(colour);
  if (c === null) return colour === 'none' || colour === 'transparent' ? 'neutral' : 'unknown';
  const [r, g, b] = c.map((v) => v / 255) as [number, number, number];
  const max = Math.max(r, g, b);
  const min = Math.min(r, g, b);
  if (min > 0.97) return 'proposedExcavation';
  const saturation = max === 0 ? 0 : (max - min) / max;
  if (saturation < 0.2) return 'neutral';
  let hue: number;
  if (max === r) hue = ((g - b) / (max - min)) * 60;
  else if (max === g) hue = ((b - r) / (max - min)) * 60 + 120;
  else hue = ((r - g) / (max - min)) * 60 + 240;
  if (hue < 0) hue += 360;
  if (hue < 14 || hue >= 335) return 'power';
  if (hue < 40) return 'communication';
  if (hue < 70) return 'gas';
  if (hue < 170) return 'sewer';
  if (hue < 260) return 'water';
  if (hue < 300) return 'reclaimed';
  return 'survey';
}
