import { Module } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { ThrottlerModule } from '@nestjs/throttler';

import type { Env } from '../config/env.schema.js';
import { PacketRenderingModule } from '../packets/packet-rendering.module.js';
import { LocateLinksController } from './locate-links.controller.js';
import { LocateLinksService } from './locate-links.service.js';
import { LocateMissLimiter } from './locate-miss-limiter.js';
import { LocateThrottlerGuard } from './locate-throttler.guard.js';
import { LocateController } from './locate.controller.js';
import { LocateRepository } from './locate.repository.js';
import { LocateService } from './locate.service.js';

/** Locate links (owner side) and the public locate view; exports what issuing and the portal reuse. */
@Module({
  imports: [
    // The packet's Chromium renderer prints the locate sheet (one browser per process).
    PacketRenderingModule,
    // This module's own throttler (ThrottlerModule is not global): the auth module keeps its limits.
    ThrottlerModule.forRootAsync({
      inject: [ConfigService],
      useFactory: (config: ConfigService<Env, true>) => ({
        throttlers: [{ name: 'locate', ttl: 60_000, limit: config.get('LOCATE_RATE_LIMIT_PER_MINUTE', { infer: true }) }],
      }),
    }),
  ],
  controllers: [LocateController, LocateLinksController],
  providers: [LocateRepository, LocateService, LocateLinksService, LocateMissLimiter, LocateThrottlerGuard],
  exports: [LocateLinksService, LocateService],
})
export class LocateModule {}
