import { Injectable } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';

import { PgBossQueue, type QueueSettings } from '../common/pg-boss-queue.js';
import type { Env } from '../config/env.schema.js';

export const PASSWORD_RESET_REQUEST_QUEUE = 'password-reset-request';

export interface PasswordResetRequestJob {
  /** The address as the visitor typed it (already validated and lower-cased by the request schema). */
  email: string;
}

/**
 * Password-reset requests, queued before anything is looked up: the request for an address with an
 * account and for one without do exactly the same work before the answer (one queue message), so the
 * answer's timing tells nothing. The worker then looks the address up and queues the e-mail.
 */
@Injectable()
export class PasswordResetQueue extends PgBossQueue<PasswordResetRequestJob> {
  constructor(config: ConfigService<Env, true>) {
    super(config);
  }

  protected settings(): QueueSettings {
    return { name: PASSWORD_RESET_REQUEST_QUEUE, retryLimit: 5, retryDelay: 5, expireInSeconds: 60 };
  }
}
