import { Injectable, Logger, type BeforeApplicationShutdown } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import PgBoss from 'pg-boss';

import type { Env } from '../config/env.schema.js';

export const PACKET_RENDER_QUEUE = 'packet-render';

export interface PacketRenderJob {
  revisionId: string;
}

/** A worker's handler for one job; `isFinalAttempt` is true when pg-boss will not retry after a failure. */
export type PacketRenderHandler = (job: PacketRenderJob, meta: { isFinalAttempt: boolean }) => Promise<void>;

/**
 * The render queue on pg-boss 10 (its own `pgboss` schema in the application's database). Started on
 * first use, so processes that never issue or render pay nothing; stopped gracefully before the
 * database pool closes (in-flight renders finish first). Every process that talks to the same
 * database shares the queue: run as many workers as you like.
 */
@Injectable()
export class PacketQueue implements BeforeApplicationShutdown {
  private readonly logger = new Logger(PacketQueue.name);
  private boss: Promise<PgBoss> | undefined;

  constructor(private readonly config: ConfigService<Env, true>) {}

  private start(): Promise<PgBoss> {
    this.boss ??= (async () => {
      const boss = new PgBoss({
        connectionString: this.config.get('DATABASE_URL', { infer: true }),
        schema: 'pgboss',
        max: 4,
        application_name: 'loamline-queue',
      });
      boss.on('error', (error) => this.logger.error(`queue error: ${error.message}`));
      try {
        await boss.start();
        await boss.createQueue(PACKET_RENDER_QUEUE, {
          name: PACKET_RENDER_QUEUE,
          retryLimit: this.config.get('PACKET_RENDER_RETRIES', { infer: true }),
          retryDelay: 5,
          retryBackoff: true,
          expireInSeconds: 15 * 60,
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

  async enqueue(job: PacketRenderJob): Promise<void> {
    const boss = await this.start();
    await boss.send(PACKET_RENDER_QUEUE, job, {
      retryLimit: this.config.get('PACKET_RENDER_RETRIES', { infer: true }),
      retryDelay: 5,
      retryBackoff: true,
    });
  }

  /** Starts `workers` pollers in this process, each taking one job at a time. */
  async work(workers: number, handler: PacketRenderHandler): Promise<void> {
    const boss = await this.start();
    const pollingIntervalSeconds = this.config.get('QUEUE_POLL_INTERVAL_SECONDS', { infer: true });
    for (let i = 0; i < workers; i += 1) {
      await boss.work<PacketRenderJob>(
        PACKET_RENDER_QUEUE,
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
