import { type BeforeApplicationShutdown, Module, type OnApplicationBootstrap } from '@nestjs/common';

import { PacketsModule } from '../packets/packets.module.js';
import { DeliveryQueue } from './delivery-queue.js';
import { DeliveriesController, DeliveryController } from './delivery.controller.js';
import { DeliveryRepository } from './delivery.repository.js';
import { DeliveryService } from './delivery.service.js';
import { PacketSendWorker } from './packet-send.worker.js';

/**
 * E-mailing packets. The send worker always runs in the API process (sending is light and needs no
 * Chromium); several API instances share the queue and a claim keeps each delivery to one sender.
 */
@Module({
  imports: [PacketsModule],
  controllers: [DeliveryController, DeliveriesController],
  providers: [DeliveryService, DeliveryRepository, DeliveryQueue, PacketSendWorker],
})
export class DeliveryModule implements OnApplicationBootstrap, BeforeApplicationShutdown {
  constructor(private readonly worker: PacketSendWorker) {}

  onApplicationBootstrap(): void {
    this.worker.startInBackground();
  }

  beforeApplicationShutdown(): void {
    this.worker.stop();
  }
}
