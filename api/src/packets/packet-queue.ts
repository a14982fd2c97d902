import { Injectable } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';

import { PgBossQueue, type QueueHandler, type QueueSettings } from '../common/pg-boss-queue.js';
import type { Env } from '../config/env.schema.js';

export const PACKET_RENDER_QUEUE = 'packet-render';

export interface PacketRenderJob {
  revisionId: string;
}

export type PacketRenderHandler = QueueHandler<PacketRenderJob>;

/** The render queue: run as many workers on the same database as you like. */
@Injectable()
export class PacketQueue extends PgBossQueue<PacketRenderJob> {
  constructor(config: ConfigService<Env, true>) {
    super(config);
  }

  protected settings(): QueueSettings {
    return {
      name: PACKET_RENDER_QUEUE,
      retryLimit: this.config.get('PACKET_RENDER_RETRIES', { infer: true }),
      retryDelay: 5,
      // A worker killed mid-render leaves its job active; past this it is expired and retried.
      expireInSeconds: this.config.get('PACKET_RENDER_STALE_SECONDS', { infer: true }),
    };
  }
}
