import { Injectable, Logger } from '@nestjs/common';

import { QueueWorker } from '../common/queue-worker.js';
import { AuthService } from './auth.service.js';
import { PasswordResetQueue } from './password-reset-queue.js';

/** Turns queued reset requests into reset rows and queued e-mail (AuthService.processPasswordResetRequest). */
@Injectable()
export class PasswordResetRequestWorker extends QueueWorker {
  protected readonly logger = new Logger(PasswordResetRequestWorker.name);
  protected readonly workerName = 'password reset request worker';

  constructor(
    private readonly queue: PasswordResetQueue,
    private readonly auth: AuthService,
  ) {
    super();
  }

  protected async startWork(): Promise<void> {
    await this.queue.work(1, (job) => this.auth.processPasswordResetRequest(job.email));
  }
}
