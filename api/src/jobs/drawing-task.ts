import type { AsBuiltAnalysis } from '../domain/analysis/analyze.js';
import type { AsBuilt } from '../domain/as-built/as-built.schema.js';
import type { JobSitePlanOptions } from '../drawings/job-drawings.js';
import type { UnitSystem } from '../drawings/drawing-units.js';

/** One drawing to make, as sent to a drawing thread (plain data: it crosses a structured clone). */
/** `locale`: the company's, for the site plan legend's spelling (en-US when absent). */
export type DrawingTask = { asBuilt: AsBuilt; analysis: AsBuiltAnalysis; units: UnitSystem; locale?: string } & (
  | { kind: 'site-plan'; sitePlan: JobSitePlanOptions }
  | { kind: 'schematic' }
  | { kind: 'depth-profile'; runId: string }
);
