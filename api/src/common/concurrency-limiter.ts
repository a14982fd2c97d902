/** Thrown when the limiter's queue is full or a wait lasted longer than allowed. */
export class LimiterBusyError extends Error {
  constructor(
    message: string,
    /** A fair guess of when to try again, seconds (for Retry-After). */
    readonly retryAfterSeconds: number,
  ) {
    super(message);
    this.name = 'LimiterBusyError';
  }
}

export interface ConcurrencyLimiterOptions {
  /** Tasks running at once. */
  concurrency: number;
  /** Tasks that may wait; one more is refused at once. */
  maxQueue: number;
  /** Longest wait for a turn, ms; then the task is refused without having run. */
  maxWaitMs: number;
  name: string;
}

/**
 * A semaphore with a bounded FIFO queue: at most `concurrency` tasks run, the next `maxQueue` wait
 * their turn (each at most `maxWaitMs`), anything beyond is refused with LimiterBusyError.
 */
export class ConcurrencyLimiter {
  private active = 0;
  private readonly waiting: { start: () => void; timer: NodeJS.Timeout }[] = [];

  constructor(private readonly options: ConcurrencyLimiterOptions) {}

  get running(): number {
    return this.active;
  }

  get queued(): number {
    return this.waiting.length;
  }

  async run<T>(task: () => Promise<T>): Promise<T> {
    await this.acquire();
    try {
      return await task();
    } finally {
      this.release();
    }
  }

  private acquire(): Promise<void> {
    if (this.active < this.options.concurrency) {
      this.active += 1;
      return Promise.resolve();
    }
    const retryAfter = Math.max(1, Math.ceil(this.options.maxWaitMs / 1000));
    if (this.waiting.length >= this.options.maxQueue) {
      return Promise.reject(new LimiterBusyError(`${this.options.name}: ${this.waiting.length} tasks already waiting`, retryAfter));
    }
    return new Promise<void>((resolve, reject) => {
      const entry = {
        start: () => {
          clearTimeout(entry.timer);
          resolve();
        },
        timer: setTimeout(() => {
          const index = this.waiting.indexOf(entry);
          if (index >= 0) this.waiting.splice(index, 1);
          reject(new LimiterBusyError(`${this.options.name}: waited longer than ${this.options.maxWaitMs} ms`, retryAfter));
        }, this.options.maxWaitMs),
      };
      this.waiting.push(entry);
    });
  }

  private release(): void {
    const next = this.waiting.shift();
    if (next) next.start();
    else this.active -= 1;
  }
}
