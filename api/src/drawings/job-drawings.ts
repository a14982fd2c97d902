import type { AsBuiltAnalysis } from '../domain/analysis/analyze.js';
import type { AsBuilt } from '../domain/as-built/as-built.schema.js';
import { SITE_PLAN_LAYER_NAMES, type SitePlanLayerName } from '../domain/jobs/job-drawings.schema.js';
import { drawDepthProfile } from './depth-profile.js';
import type { PixelPoint, PlanImage, PlanSheet, SitePlanLayers, TitleBlockInfo } from './drawing-options.js';
import type { UnitSystem } from './drawing-units.js';
import type { Orientation, PaperSize, SheetMargins } from './paper.js';
import { drawSitePlan } from './site-plan.js';
import type { SvgCanvasFactory } from './svg-canvas.js';
import { drawWiringSchematic } from './wiring-schematic.js';

/**
 * The drawings of one job as the server routes, the packet and the web app all make them: one place
 * decides the title block, the plan image underneath and the layer names, so the three agree.
 * Browser-safe (no Node import): the caller passes the canvas factory.
 */

export { SITE_PLAN_LAYER_NAMES, type SitePlanLayerName };

const LAYER_KEYS: Record<SitePlanLayerName, keyof SitePlanLayers> = {
  'reference-points': 'referencePoints',
  labels: 'labels',
  depths: 'depths',
  'spare-and-abandoned': 'spareAndAbandoned',
};

export const SITE_PLAN_LAYER_LABELS: Record<SitePlanLayerName, string> = {
  'reference-points': 'Reference points and accuracy',
  labels: 'Labels',
  depths: 'Depths',
  'spare-and-abandoned': 'Spare and abandoned runs',
};

/** The layers option with `off` turned off and everything else on. */
export function layersWithout(off: readonly SitePlanLayerName[]): Partial<SitePlanLayers> {
  return Object.fromEntries(off.map((name) => [LAYER_KEYS[name], false]));
}

/** A site's stored plan image and calibration (pixels of the stored image, metres between the points). */
export interface SitePlanImageSource {
  /** A data: URL of the image (any size with the same aspect ratio as `widthPx` × `heightPx`). */
  href: string;
  widthPx: number;
  heightPx: number;
  calibration: { a: PixelPoint; b: PixelPoint; distanceM: number };
}

/**
 * The drawing option for a site's plan image. The first calibration point is taken to lie at the plan
 * origin (0, 0) and the image to be drawn with plan +y up — the convention of the plan editor.
 */
export function planImageForDrawing(source: SitePlanImageSource): PlanImage {
  return {
    href: source.href,
    widthPx: source.widthPx,
    heightPx: source.heightPx,
    calibration: { imageA: source.calibration.a, imageB: source.calibration.b, distanceM: source.calibration.distanceM },
  };
}

export interface JobTitleSource {
  jobTitle: string;
  siteLabel: string;
  /** The address line (packet) or the town (screen), after the site label. */
  place: string;
  revision: number;
  /** Already formatted; drawings never read the clock. */
  date?: string;
  preparedBy?: string;
}

export function jobTitleBlock(source: JobTitleSource): TitleBlockInfo {
  return {
    title: source.jobTitle,
    subtitle: [source.siteLabel, source.place].join(', '),
    revision: String(source.revision),
    ...(source.date !== undefined ? { date: source.date } : {}),
    ...(source.preparedBy !== undefined ? { preparedBy: source.preparedBy } : {}),
  };
}

export interface JobDrawingInput {
  asBuilt: AsBuilt;
  analysis: AsBuiltAnalysis;
  createCanvas: SvgCanvasFactory;
  units: UnitSystem;
  /** The company's locale, for the legend's spelling (en-US when absent). */
  locale?: string | null;
}

export interface JobSitePlanOptions {
  paper: PaperSize;
  orientation?: Orientation | 'auto';
  /** Space kept above and below the drawing on its page (heading, caption), pt. */
  headroomPt?: number;
  margins?: SheetMargins;
  /** The site plan (default) or the ties sheet. */
  sheet?: PlanSheet;
  titleBlock?: TitleBlockInfo;
  planImage?: PlanImage;
  layersOff?: readonly SitePlanLayerName[];
  /** Provenance lines under run labels, by run id (the packet's plan). */
  runProvenance?: Readonly<Record<string, readonly string[]>>;
}

export function drawJobSitePlan(input: JobDrawingInput, options: JobSitePlanOptions): string {
  return drawSitePlan(input.asBuilt, input.analysis, {
    createCanvas: input.createCanvas,
    units: input.units,
    ...(input.locale ? { locale: input.locale } : {}),
    paper: options.paper,
    orientation: options.orientation ?? 'portrait',
    ...(options.headroomPt !== undefined ? { headroomPt: options.headroomPt } : {}),
    ...(options.margins ? { margins: options.margins } : {}),
    ...(options.sheet ? { sheet: options.sheet } : {}),
    ...(options.titleBlock ? { titleBlock: options.titleBlock } : {}),
    ...(options.planImage ? { planImage: options.planImage } : {}),
    ...(options.layersOff && options.layersOff.length > 0 ? { layers: layersWithout(options.layersOff) } : {}),
    ...(options.runProvenance ? { runProvenance: options.runProvenance } : {}),
  });
}

export interface JobSchematicOptions {
  paper?: PaperSize;
  orientation?: Orientation | 'auto';
  headroomPt?: number;
  margins?: SheetMargins;
  showFindings?: boolean;
}

export function drawJobSchematic(input: JobDrawingInput, options: JobSchematicOptions = {}): Promise<string> {
  return drawWiringSchematic(input.asBuilt, input.analysis, { createCanvas: input.createCanvas, units: input.units, ...options });
}

export function drawJobDepthProfile(input: JobDrawingInput, runId: string): string {
  return drawDepthProfile(input.asBuilt, input.analysis, runId, { createCanvas: input.createCanvas, units: input.units });
}
