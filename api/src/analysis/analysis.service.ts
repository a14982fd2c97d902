import { Injectable } from '@nestjs/common';

import { type AsBuiltAnalysis, analyzeAsBuilt } from '../domain/analysis/analyze.js';
import type { AnalysisRequest } from '../domain/analysis/analysis-request.schema.js';

@Injectable()
export class AnalysisService {
  analyze(request: AnalysisRequest): AsBuiltAnalysis {
    return analyzeAsBuilt(request.asBuilt, request.options);
  }
}
