import { type BeforeApplicationShutdown, Module, type OnApplicationBootstrap } from '@nestjs/common';

import { AccountMailQueue } from './account-mail-queue.js';
import { AccountMailWorker } from './account-mail.worker.js';
import { OutgoingMailRepository } from './outgoing-mail.repository.js';
import { OutgoingMailService } from './outgoing-mail.service.js';

/**
 * The account-mail queue (invitations, password resets). Its worker runs in every API process: sending
 * is light, several instances share the queue, and a claim keeps each message to one sender.
 */
@Module({
  providers: [OutgoingMailService, OutgoingMailRepository, AccountMailQueue, AccountMailWorker],
  exports: [OutgoingMailService],
})
export class OutgoingMailModule implements OnApplicationBootstrap, BeforeApplicationShutdown {
  constructor(private readonly worker: AccountMailWorker) {}

  onApplicationBootstrap(): void {
    this.worker.startInBackground();
  }

  beforeApplicationShutdown(): void {
    this.worker.stop();
  }
}
