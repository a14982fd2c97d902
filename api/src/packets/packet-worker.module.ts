import { Module, type OnApplicationBootstrap } from '@nestjs/common';
import { ConfigModule } from '@nestjs/config';

import { AuditModule } from '../audit/audit.module.js';
import { readEnv } from '../config/env.schema.js';
import { DbModule } from '../db/db.module.js';
import { StorageModule } from '../storage/storage.module.js';
import { PacketRenderWorker } from './packet-render.worker.js';
import { PacketRenderingModule } from './packet-rendering.module.js';

/**
 * Root module of a standalone render worker (`npm run worker`): configuration, database, storage and
 * the rendering pipeline, no HTTP. Any number of these share the pg-boss queue with the API.
 */
@Module({
  imports: [
    ConfigModule.forRoot({ isGlobal: true, ignoreEnvFile: true, validate: (env) => readEnv(env) }),
    DbModule,
    StorageModule,
    // The renderer imports the job record's module, whose writer audits.
    AuditModule,
    PacketRenderingModule,
  ],
})
export class PacketWorkerModule implements OnApplicationBootstrap {
  constructor(private readonly worker: PacketRenderWorker) {}

  async onApplicationBootstrap(): Promise<void> {
    await this.worker.start();
  }
}
