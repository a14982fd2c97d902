import { Controller, Get, HttpStatus, Res } from '@nestjs/common';
import { ApiOperation, ApiTags } from '@nestjs/swagger';
import type { Response } from 'express';

import { ApiContract } from '../common/api-contract.decorator.js';
import { Public } from '../common/decorators/public.decorator.js';
import { type HealthResponse, HealthResponseSchema } from '../domain/health/health.schema.js';
import { HealthService } from './health.service.js';

@ApiTags('health')
@Controller('health')
export class HealthController {
  constructor(private readonly healthService: HealthService) {}

  @Public()
  @Get()
  @ApiOperation({ summary: 'Liveness of the API and reachability of its database' })
  @ApiContract({ responses: { 200: HealthResponseSchema, 503: HealthResponseSchema } })
  async check(@Res({ passthrough: true }) res: Response): Promise<HealthResponse> {
    const health = await this.healthService.check();
    res.status(health.status === 'ok' ? HttpStatus.OK : HttpStatus.SERVICE_UNAVAILABLE);
    res.setHeader('Cache-Control', 'no-store');
    return health;
  }
}
