import { type BeforeApplicationShutdown, Logger } from '@nestjs/common';
import type { ConfigService } from '@nestjs/config';
import PgBoss from 'pg-boss';

import type { Env } from '../config/env.schema.js';

/** A worker's handler for one job; `isFinalAttempt` is true when pg-boss will not retry after a failure. */
export type QueueHandler<T> = (job: T, meta: { isFinalAttempt: boolean }) => Promise<void>;

export interface QueueSettings {
  name: string;
  retryLimit: number;
  /** Seconds before the first retry; later retries back off exponentially. */
  retryDelay: number;
  expireInSeconds: number;
  /** Connections of this queue's own pool. */
  poolSize: number;
}

/**
 * One named queue on pg-boss 10, in the `pgboss` schema of the application's database. Started on first
 * use, so processes that never send or work pay nothing; a failed start is not cached (the database may
 * simply not be up yet); stopped gracefully before the database pool closes, in-flight jobs first. Every
 * process on the same database shares the queue. Its connections are named `loamline-queue`.
 */
export abstract class PgBossQueue<T extends object> implements BeforeApplicationShutdown {
  private readonly logger = new Logger(this.constructor.name);
  private boss: Promise<PgBoss> | undefined;

  protected constructor(protected readonly config: ConfigService<Env, true>) {}

  protected abstract settings(): QueueSettings;

  async enqueue(job: T): Promise<void> {
    const { name, retryLimit, retryDelay, expireInSeconds } = this.settings();
    const boss = await this.start();
    // Per job, because createQueue keeps the options of whichever process created the queue first.
    await boss.send(name, job, { retryLimit, retryDelay, retryBackoff: true, expireInSeconds });
  }

  /** Starts `workers` pollers in this process, each taking one job at a time. */
  async work(workers: number, handler: QueueHandler<T>): Promise<void> {
    const { name } = this.settings();
    const boss = await this.start();
    const pollingIntervalSeconds = this.config.get('QUEUE_POLL_INTERVAL_SECONDS', { infer: true });
    for (let i = 0; i < workers; i += 1) {
      await boss.work<T>(
        name,
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

  private start(): Promise<PgBoss> {
    this.boss ??= (async () => {
      const { name, retryLimit, retryDelay, expireInSeconds, poolSize } = this.settings();
      const boss = new PgBoss({
        connectionString: this.config.get('DATABASE_URL', { infer: true }),
        schema: 'pgboss',
        max: poolSize,
        application_name: 'loamline-queue',
        // Expired jobs (their worker died) are found and retried by this maintenance.
        maintenanceIntervalSeconds: this.config.get('QUEUE_MAINTENANCE_INTERVAL_SECONDS', { infer: true }),
      });
      boss.on('error', (error) => this.logger.error(`queue error: ${error.message}`));
      try {
        await boss.start();
        await boss.createQueue(name, { name, retryLimit, retryDelay, retryBackoff: true, expireInSeconds });
      } catch (error) {
        this.boss = undefined;
        await boss.stop({ graceful: false, wait: false }).catch(() => undefined);
        throw error;
      }
      return boss;
    })();
    return this.boss;
  }
}
