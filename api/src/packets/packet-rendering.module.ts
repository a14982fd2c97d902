import { Module } from '@nestjs/common';

import { LinkBuilder } from '../mail/link-builder.js';
import { JobPhotosForPacket } from '../photos/job-photos-for-packet.js';
import { PhotosRepository } from '../photos/photos.repository.js';
import { PACKET_PHOTO_SOURCE } from './packet-photo-source.js';
import { PacketQueue } from './packet-queue.js';
import { PacketRenderWorker } from './packet-render.worker.js';
import { PacketsRepository } from './packets.repository.js';
import { PdfRendererService } from './pdf-renderer.service.js';

/**
 * Everything a process needs to render packets from the queue: the API imports it through
 * PacketsModule, the standalone worker (`npm run worker`) through PacketWorkerModule. Needs the global
 * ConfigModule, DbModule and StorageModule.
 */
@Module({
  providers: [
    PacketsRepository,
    PacketQueue,
    PdfRendererService,
    PacketRenderWorker,
    LinkBuilder,
    PhotosRepository,
    { provide: PACKET_PHOTO_SOURCE, useClass: JobPhotosForPacket },
  ],
  exports: [PacketsRepository, PacketQueue, PacketRenderWorker, PdfRendererService],
})
export class PacketRenderingModule {}
