import type { PlanPoint } from '../domain/as-built/common.schema.js';
import type { UnitSystem } from './drawing-units.js';
import type { Orientation, PaperSize, SheetMargins } from './paper.js';
import type { SvgCanvasFactory } from './svg-canvas.js';

/** Text for the title block. Every field is the caller's, already formatted (e.g. the issue date). */
export interface TitleBlockInfo {
  /** Job or site title, e.g. "Rear-yard audio, 14 Larkspur Way". */
  title?: string;
  /** Second line, e.g. the customer or the address. */
  subtitle?: string;
  revision?: string;
  /** Issue date as it should print (the drawing never reads the clock, so output stays deterministic). */
  date?: string;
  preparedBy?: string;
}

export interface PixelPoint {
  x: number;
  y: number;
}

/**
 * A site-plan image drawn underneath the plan. The calibration is two points picked on the image (in
 * image pixels, x right, y down) and the real distance between them; `planA` is where the first picked
 * point lies in plan metres (default the plan origin). The image is taken to be drawn with plan +y up.
 */
export interface PlanImage {
  /** A `data:` URL; anything else is refused so a printed packet never fetches from the network. */
  href: string;
  widthPx: number;
  heightPx: number;
  calibration: { imageA: PixelPoint; imageB: PixelPoint; distanceM: number; planA?: PlanPoint };
}

/** Which layers of the site plan are drawn. All default to on. */
export interface SitePlanLayers {
  /** Reference points and the accuracy circles of positions solved from ties (the ties are on the ties sheet). */
  referencePoints: boolean;
  /** Item, run, reference-point and tie labels. */
  labels: boolean;
  /** Minimum depth in run labels and shallow-reading markers. */
  depths: boolean;
  /** Spare and abandoned runs. */
  spareAndAbandoned: boolean;
}

export interface DrawingBaseOptions {
  createCanvas: SvgCanvasFactory;
  /** Label units; default: the as-built's display preference, else metric. */
  units?: UnitSystem;
  /** The company's BCP 47 locale: the legend's words are spelled for it (en-US "color", en-GB "colour"; en-US default). */
  locale?: string | null;
}

/**
 * Which sheet of the plan: the site plan (runs, items, depths and landmarks) or the ties sheet (reference
 * points, items and the taped tie distances between them, nothing else).
 */
export type PlanSheet = 'plan' | 'ties';

export interface SitePlanOptions extends DrawingBaseOptions {
  paper?: PaperSize;
  /** `auto`: portrait or landscape, whichever lets the plan be drawn at the larger standard scale. */
  orientation?: Orientation | 'auto';
  /** Space the page keeps above and below the drawing (heading, caption), pt; the drawing is that much shorter. */
  headroomPt?: number;
  /** The page's margins, when not the default 0.5 in / 12.7 mm (the packet's own pages). */
  margins?: SheetMargins;
  sheet?: PlanSheet;
  layers?: Partial<SitePlanLayers>;
  titleBlock?: TitleBlockInfo;
  planImage?: PlanImage;
  /**
   * Extra label lines per run id, already formatted: when it went in and by which job, and since when
   * it is abandoned (the packet's plan of the site record, issue 21). Drawn under the run's facts.
   */
  runProvenance?: Readonly<Record<string, readonly string[]>>;
}

export const DEFAULT_LAYERS: SitePlanLayers = { referencePoints: true, labels: true, depths: true, spareAndAbandoned: true };
