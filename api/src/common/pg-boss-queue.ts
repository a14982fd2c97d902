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
}

/** Connections of the process's one pg-boss pool, shared by every queue (render, send, account mail, …). */
const SHARED_POOL_SIZE = 8;
/** How long stopping waits for this queue's jobs in flight. */
const STOP_TIMEOUT_MS = 30_000;

/**
 * The process's one pg-boss instance per database, shared by every queue: started once (several
 * instances starting together raced to create the `pgboss` schema and logged "deadlock detected;
 * retrying"), each queue created once on it, and stopped when the last queue using it stops. A failed
 * start is not cached (the database may simply not be up yet).
 */
class SharedBoss {
  private static readonly byDatabase = new Map<string, SharedBoss>();
  private readonly logger = new Logger('PgBoss');
  private boss: Promise<PgBoss> | undefined;
  private readonly queues = new Map<string, Promise<void>>();
  /**
   * Queues are created one after another: pg-boss makes a table per queue, and two created at once
   * (a worker starting while the first message of another queue is sent) failed with "deadlock
   * detected", losing that send until the next sweep.
   */
  private creating: Promise<unknown> = Promise.resolve();
  private users = 0;

  private constructor(
    private readonly key: string,
    private readonly options: PgBoss.ConstructorOptions,
  ) {}

  static acquire(config: ConfigService<Env, true>): SharedBoss {
    const connectionString = config.get('DATABASE_URL', { infer: true });
    const maintenanceIntervalSeconds = config.get('QUEUE_MAINTENANCE_INTERVAL_SECONDS', { infer: true });
    const key = `${connectionString}\n${maintenanceIntervalSeconds}`;
    let shared = SharedBoss.byDatabase.get(key);
    if (!shared) {
      shared = new SharedBoss(key, {
        connectionString,
        schema: 'pgboss',
        max: SHARED_POOL_SIZE,
        application_name: 'loamline-queue',
        // Expired jobs (their worker died) are found and retried by this maintenance.
        maintenanceIntervalSeconds,
      });
      SharedBoss.byDatabase.set(key, shared);
    }
    shared.users += 1;
    return shared;
  }

  /** The started instance with `settings.name` created on it. */
  async queue({ name, retryLimit, retryDelay, expireInSeconds }: QueueSettings): Promise<PgBoss> {
    const boss = await this.start();
    let created = this.queues.get(name);
    if (!created) {
      created = this.creating
        .then(() => boss.createQueue(name, { name, retryLimit, retryDelay, retryBackoff: true, expireInSeconds }))
        .catch((error: unknown) => {
          this.queues.delete(name);
          throw error;
        });
      this.creating = created.catch(() => undefined);
      this.queues.set(name, created);
    }
    await created;
    return boss;
  }

  /** The instance if it has started (without starting it). */
  async current(): Promise<PgBoss | undefined> {
    return this.boss?.catch(() => undefined);
  }

  /** One user fewer; the last one stops the instance (jobs in flight first). */
  async release(): Promise<void> {
    this.users -= 1;
    if (this.users > 0) return;
    SharedBoss.byDatabase.delete(this.key);
    const boss = this.boss;
    this.boss = undefined;
    if (boss) await (await boss.catch(() => undefined))?.stop({ graceful: true, wait: true, timeout: STOP_TIMEOUT_MS });
  }

  private start(): Promise<PgBoss> {
    this.boss ??= (async () => {
      const boss = new PgBoss(this.options);
      boss.on('error', (error) => this.logger.error(`queue error: ${error.message}`));
      try {
        await boss.start();
      } catch (error) {
        this.boss = undefined;
        this.queues.clear();
        await boss.stop({ graceful: false, wait: false }).catch(() => undefined);
        throw error;
      }
      return boss;
    })();
    return this.boss;
  }
}

/**
 * One named queue on pg-boss 10, in the `pgboss` schema of the application's database, on the
 * process's shared pg-boss instance. Started on first use, so processes that never send or work pay
 * nothing; on shutdown (before the database pool closes) this queue's workers stop polling and their
 * jobs in flight finish first. Every process on the same database shares the queue. Its connections are
 * named `loamline-queue`.
 */
export abstract class PgBossQueue<T extends object> implements BeforeApplicationShutdown {
  private shared: SharedBoss | undefined;
  private isStopped = false;
  private readonly workerIds: string[] = [];
  private readonly inFlight = new Set<Promise<void>>();

  protected constructor(protected readonly config: ConfigService<Env, true>) {}

  protected abstract settings(): QueueSettings;

  async enqueue(job: T): Promise<void> {
    const { name, retryLimit, retryDelay, expireInSeconds } = this.settings();
    const boss = await this.boss();
    // Per job, because createQueue keeps the options of whichever process created the queue first.
    await boss.send(name, job, { retryLimit, retryDelay, retryBackoff: true, expireInSeconds });
  }

  /** Starts `workers` pollers in this process, each taking one job at a time. */
  async work(workers: number, handler: QueueHandler<T>): Promise<void> {
    const { name } = this.settings();
    const boss = await this.boss();
    const pollingIntervalSeconds = this.config.get('QUEUE_POLL_INTERVAL_SECONDS', { infer: true });
    for (let i = 0; i < workers; i += 1) {
      const id = await boss.work<T>(
        name,
        { batchSize: 1, pollingIntervalSeconds, includeMetadata: true },
        // pg-boss 10 hands the handler an array of jobs (one here, batchSize 1).
        async (jobs) => {
          const run = (async () => {
            for (const job of jobs) await handler(job.data, { isFinalAttempt: job.retryCount >= job.retryLimit });
          })();
          this.inFlight.add(run);
          try {
            await run;
          } finally {
            this.inFlight.delete(run);
          }
        },
      );
      this.workerIds.push(id);
    }
  }

  async beforeApplicationShutdown(): Promise<void> {
    this.isStopped = true;
    const shared = this.shared;
    this.shared = undefined;
    if (!shared) return;
    const boss = await shared.current();
    if (boss) for (const id of this.workerIds.splice(0)) await boss.offWork({ id });
    let timer: NodeJS.Timeout | undefined;
    await Promise.race([
      Promise.allSettled([...this.inFlight]),
      new Promise((resolve) => (timer = setTimeout(resolve, STOP_TIMEOUT_MS))),
    ]);
    clearTimeout(timer);
    await shared.release();
  }

  private boss(): Promise<PgBoss> {
    // Late work during shutdown must not start a new instance nobody stops (committed rows that never
    // reached the queue are swept up by the next start).
    if (this.isStopped) return Promise.reject(new Error(`queue ${this.settings().name} is stopped`));
    this.shared ??= SharedBoss.acquire(this.config);
    return this.shared.queue(this.settings());
  }
}
