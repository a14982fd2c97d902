import { Injectable } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';

import { PgBossQueue, type QueueHandler, type QueueSettings } from '../common/pg-boss-queue.js';
import type { Env } from '../config/env.schema.js';

export const PACKET_SEND_QUEUE = 'packet-send';

export interface PacketSendJob {
  deliveryId: string;
}

export type PacketSendHandler = QueueHandler<PacketSendJob>;

/** The packet e-mail queue; a failed send is retried with backoff from PACKET_SEND_RETRY_DELAY_SECONDS. */
@Injectable()
export class DeliveryQueue extends PgBossQueue<PacketSendJob> {
  constructor(config: ConfigService<Env, true>) {
    super(config);
  }

  protected settings(): QueueSettings {
    return {
      name: PACKET_SEND_QUEUE,
      retryLimit: this.config.get('PACKET_SEND_RETRIES', { infer: true }),
      retryDelay: this.config.get('PACKET_SEND_RETRY_DELAY_SECONDS', { infer: true }),
      expireInSeconds: 5 * 60,
    };
  }
}
