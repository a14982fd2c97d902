import { Controller, Get, HttpStatus, Res } from '@nestjs/common';
import { ApiOperation, ApiResponse, ApiTags } from '@nestjs/swagger';
import type { Response } from 'express';

import { Public } from '../common/decorators/public.decorator.js';
import type { HealthResponse } from '../domain/health/health.schema.js';
import { HealthService } from './health.service.js';

@ApiTags('health')
@Controller('health')
export class HealthController {
  constructor(private readonly healthService: HealthService) {}

  @Public()
  @Get()
  @ApiOperation({ summary: 'Liveness of the API and reachability of its database' })
  @ApiResponse({
    status: 200,
    description: 'API and database are up',
    example: { status: 'ok', database: { status: 'up', latencyMs: 0.8 }, version: '0.1.0', uptimeSeconds: 42 },
  })
  @ApiResponse({
    status: 503,
    description: 'The database cannot be reached',
    example: {
      status: 'error',
      database: { status: 'down', error: 'database unreachable' },
      version: '0.1.0',
      uptimeSeconds: 42,
    },
  })
  async check(@Res({ passthrough: true }) res: Response): Promise<HealthResponse> {
    const health = await this.healthService.check();
    res.status(health.status === 'ok' ? HttpStatus.OK : HttpStatus.SERVICE_UNAVAILABLE);
    res.setHeader('Cache-Control', 'no-store');
    return health;
  }
}
