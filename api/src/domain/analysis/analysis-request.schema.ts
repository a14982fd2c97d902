import { z } from 'zod';

import { AsBuiltSchema } from '../as-built/as-built.schema.js';
import { AnalysisOptionsSchema } from './analysis-options.schema.js';

/** `POST /api/analysis`: an as-built and, optionally, analysis options (every option has a default). */
export const AnalysisRequestSchema = z.object({
  asBuilt: AsBuiltSchema,
  options: AnalysisOptionsSchema.optional(),
});
export type AnalysisRequest = z.infer<typeof AnalysisRequestSchema>;
