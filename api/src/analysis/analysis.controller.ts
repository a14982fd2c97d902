import { Body, Controller, HttpCode, HttpStatus, Post } from '@nestjs/common';
import { ApiBearerAuth, ApiOperation, ApiResponse, ApiTags } from '@nestjs/swagger';

import { ApiContract } from '../common/api-contract.decorator.js';
import { Roles } from '../common/decorators/roles.decorator.js';
import { ZodValidationPipe } from '../common/zod-validation.pipe.js';
import { type AnalysisRequest, AnalysisRequestSchema } from '../domain/analysis/analysis-request.schema.js';
import { AsBuiltAnalysisSchema } from '../domain/analysis/analysis.schema.js';
import type { AsBuiltAnalysis } from '../domain/analysis/analyze.js';
import { AnalysisService } from './analysis.service.js';

@ApiTags('analysis')
@ApiBearerAuth()
@Roles('admin', 'office', 'lead', 'tech')
@Controller('analysis')
export class AnalysisController {
  constructor(private readonly analysisService: AnalysisService) {}

  @Post()
  @HttpCode(HttpStatus.OK)
  @ApiOperation({
    summary: 'Analyse an as-built: cable resistance and loss, channel loads, depth rules, positions, checks',
    description:
      'Stateless: nothing is stored. All values are SI (metres, ohms, watts, °C). Findings carry a severity, a ' +
      'plain explanation and the path of the field they concern. Checks are engineering aids, not code approval.',
  })
  @ApiResponse({ status: 400, description: 'The as-built is malformed; `issues[].path` names each bad field' })
  @ApiContract({ body: AnalysisRequestSchema, responses: { 200: AsBuiltAnalysisSchema } })
  analyze(@Body(new ZodValidationPipe(AnalysisRequestSchema)) body: AnalysisRequest): AsBuiltAnalysis {
    return this.analysisService.analyze(body);
  }
}
