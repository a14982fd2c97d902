import { Injectable } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';

import { PgBossQueue, type QueueSettings } from '../common/pg-boss-queue.js';
import type { Env } from '../config/env.schema.js';

export const ACCOUNT_MAIL_QUEUE = 'account-mail';

export interface AccountMailJob {
  mailId: string;
}

/** Invitation and password-reset e-mail; a failed send is retried with backoff from ACCOUNT_MAIL_RETRY_DELAY_SECONDS. */
@Injectable()
export class AccountMailQueue extends PgBossQueue<AccountMailJob> {
  constructor(config: ConfigService<Env, true>) {
    super(config);
  }

  protected settings(): QueueSettings {
    return {
      name: ACCOUNT_MAIL_QUEUE,
      retryLimit: this.config.get('ACCOUNT_MAIL_RETRIES', { infer: true }),
      retryDelay: this.config.get('ACCOUNT_MAIL_RETRY_DELAY_SECONDS', { infer: true }),
      // Far above one attempt, which the SMTP timeouts bound to well under a minute.
      expireInSeconds: 5 * 60,
    };
  }
}
