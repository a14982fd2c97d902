import { Injectable, Logger } from '@nestjs/common';

import { APP_VERSION } from '../config/env.schema.js';
import type { HealthResponse } from '../domain/health/health.schema.js';
import { HealthRepository } from './health.repository.js';

@Injectable()
export class HealthService {
  private readonly logger = new Logger(HealthService.name);
  private readonly startedAt = Date.now();

  constructor(private readonly repository: HealthRepository) {}

  async check(): Promise<HealthResponse> {
    const base = { version: APP_VERSION, uptimeSeconds: Math.round((Date.now() - this.startedAt) / 1000) };
    const started = performance.now();
    try {
      await this.repository.ping();
      const latencyMs = Math.round((performance.now() - started) * 10) / 10;
      return { status: 'ok', database: { status: 'up', latencyMs }, ...base };
    } catch (error) {
      this.logger.warn(`database check failed: ${(error as Error).message}`);
      return { status: 'error', database: { status: 'down', error: 'database unreachable' }, ...base };
    }
  }
}
