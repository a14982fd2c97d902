import { Module } from '@nestjs/common';

import { JobRecordModule } from '../jobs/job-record.module.js';
import { LinkBuilder } from '../mail/link-builder.js';
import { JobPhotosForPacket } from '../photos/job-photos-for-packet.js';
import { PACKET_PHOTO_SOURCE } from './packet-photo-source.js';
import { PacketQueue } from './packet-queue.js';
import { PacketRenderWorker } from './packet-render.worker.js';
import { PacketsRepository } from './packets.repository.js';
import { PdfRendererService } from './pdf-renderer.service.js';

/**
 * Everything a process needs to render packets from the queue: the API imports it through
 * PacketsModule, the standalone worker (`npm run worker`) through PacketWorkerModule. Needs the global
 * ConfigModule, DbModule, StorageModule and AuditModule (JobRecordModule's writer audits).
 */
@Module({
  imports: [JobRecordModule],
  providers: [
    PacketsRepository,
    PacketQueue,
    PdfRendererService,
    PacketRenderWorker,
    LinkBuilder,
    { provide: PACKET_PHOTO_SOURCE, useClass: JobPhotosForPacket },
  ],
  exports: [PacketsRepository, PacketQueue, PacketRenderWorker, PdfRendererService],
})
export class PacketRenderingModule {}
