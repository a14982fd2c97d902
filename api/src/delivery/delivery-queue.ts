import { Injectable, Logger, type BeforeApplicationShutdown } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import PgBoss from 'pg-boss';

import type { Env } from '../config/env.schema.js';

export const PACKET_SEND_QUEUE = 'packet-send';

export interface PacketSendJob {
  deliveryId: string;
}

/** A worker's handler for one job; `isFinalAttempt` is true when pg-boss will not retry after a failure. */
export type PacketSendHandler = (job: PacketSendJob, meta: { isFinalAttempt: boolean }) => Promise<void>;

/**
 * The packet e-mail queue on pg-boss 10, in the same `pgboss` schema as the render queue (the same
 * pattern as PacketQueue: started on first use, stopped gracefully before the database pool closes).
 * A failed send is retried with exponential backoff from PACKET_SEND_RETRY_DELAY_SECONDS.
 */
@Injectable()
export class DeliveryQueue implements BeforeApplicationShutdown {
  private readonly logger = new Logger(DeliveryQueue.name);
  private boss: Promise<PgBoss> | undefined;

  constructor(private readonly config: ConfigService<Env, true>) {}

  private start(): Promise<PgBoss> {
    this.boss ??= (async () => {
      const boss = new PgBoss({
        connectionString: this.config.get('DATABASE_URL', { infer: true }),
        schema: 'pgboss',
        max: 2,
        application_name: 'loamline-queue',
      });
      boss.on('error', (error) => this.logger.error(`queue error: ${error.message}`));
      try {
        await boss.start();
        await boss.createQueue(PACKET_SEND_QUEUE, {
          name: PACKET_SEND_QUEUE,
          retryLimit: this.config.get('PACKET_SEND_RETRIES', { infer: true }),
          retryDelay: this.config.get('PACKET_SEND_RETRY_DELAY_SECONDS', { infer: true }),
          retryBackoff: true,
          expireInSeconds: 5 * 60,
        });
      } catch (error) {
        // Not cached: the next call tries again (the database may simply not be up yet).
        this.boss = undefined;
        await boss.stop({ graceful: false, wait: false }).catch(() => undefined);
        throw error;
      }
      return boss;
    })();
    return this.boss;
  }

  async enqueue(job: PacketSendJob): Promise<void> {
    const boss = await this.start();
    await boss.send(PACKET_SEND_QUEUE, job, {
      retryLimit: this.config.get('PACKET_SEND_RETRIES', { infer: true }),
      retryDelay: this.config.get('PACKET_SEND_RETRY_DELAY_SECONDS', { infer: true }),
      retryBackoff: true,
    });
  }

  /** Starts `workers` pollers in this process, each taking one message at a time. */
  async work(workers: number, handler: PacketSendHandler): Promise<void> {
    const boss = await this.start();
    const pollingIntervalSeconds = this.config.get('QUEUE_POLL_INTERVAL_SECONDS', { infer: true });
    for (let i = 0; i < workers; i += 1) {
      await boss.work<PacketSendJob>(
        PACKET_SEND_QUEUE,
        { batchSize: 1, pollingIntervalSeconds, includeMetadata: true },
        // pg-boss 10 hands the handler an array of jobs (one here, batchSize 1).
        async (jobs) => {
          for (const job of jobs) await handler(job.data, { isFinalAttempt: job.retryCount >= job.retryLimit });
        },
      );
    }
  }

  async beforeApplicationShutdown(): Promise<void> {
    const boss = this.boss;
    this.boss = undefined;
    if (boss) await (await boss.catch(() => undefined))?.stop({ graceful: true, wait: true, timeout: 30_000 });
  }
}
