import { type BeforeApplicationShutdown, Module, type OnApplicationBootstrap } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';

import type { Env } from '../config/env.schema.js';
import { JobRecordModule } from '../jobs/job-record.module.js';
import { LocateModule } from '../locate/locate.module.js';
import { PacketRenderWorker } from './packet-render.worker.js';
import { PacketRenderingModule } from './packet-rendering.module.js';
import { PacketsController } from './packets.controller.js';
import { PacketsService } from './packets.service.js';
import { SignaturesController } from './signatures.controller.js';
import { SignaturesRepository } from './signatures.repository.js';
import { SignaturesService } from './signatures.service.js';

/** The packet API; with PACKET_WORKER_IN_API (default) this process also renders queued packets. */
@Module({
  imports: [JobRecordModule, PacketRenderingModule, LocateModule],
  controllers: [PacketsController, SignaturesController],
  providers: [PacketsService, SignaturesService, SignaturesRepository],
  // The portal and the send worker serve the same verified files.
  exports: [PacketsService],
})
export class PacketsModule implements OnApplicationBootstrap, BeforeApplicationShutdown {
  constructor(
    private readonly worker: PacketRenderWorker,
    private readonly config: ConfigService<Env, true>,
  ) {}

  onApplicationBootstrap(): void {
    if (this.config.get('PACKET_WORKER_IN_API', { infer: true })) this.worker.startInBackground();
  }

  beforeApplicationShutdown(): void {
    this.worker.stop();
  }
}
