import type { Logger } from '@nestjs/common';

/**
 * Start and stop of a process's queue worker (packet render, packet send, account mail): start in the
 * background without holding up the caller, retry with backoff (1 s doubling to 30 s) while the
 * database cannot be reached — so the API boots, answers 503 and starts working once PostgreSQL is
 * back — and start at most once.
 */
export abstract class QueueWorker {
  protected abstract readonly logger: Logger;
  /** For the log lines, e.g. "packet render worker". */
  protected abstract readonly workerName: string;
  private isStarted = false;
  private isStopping = false;
  private retryTimer: NodeJS.Timeout | undefined;

  /** Subscribes to the queue and picks up work whose message was lost; throws when it cannot. */
  protected abstract startWork(): Promise<void>;

  /** After a successful start (e.g. to set a periodic sweep). */
  protected onStarted(): void {}

  /** When stopping (e.g. to clear that sweep). The queue itself is stopped by its own class. */
  protected onStop(): void {}

  startInBackground(delayMs = 1_000): void {
    this.start().catch((error: Error) => {
      if (this.isStopping) return;
      this.logger.warn(`${this.workerName} not started (${error.message}); retrying in ${delayMs / 1000} s`);
      this.retryTimer = setTimeout(() => this.startInBackground(Math.min(delayMs * 2, 30_000)), delayMs);
      this.retryTimer.unref();
    });
  }

  stop(): void {
    this.isStopping = true;
    clearTimeout(this.retryTimer);
    this.onStop();
  }

  /** Starts polling in this process (idempotent). */
  async start(): Promise<void> {
    if (this.isStarted) return;
    this.isStarted = true;
    try {
      await this.startWork();
    } catch (error) {
      this.isStarted = false;
      throw error;
    }
    this.onStarted();
    this.logger.log(`${this.workerName} started`);
  }
}
