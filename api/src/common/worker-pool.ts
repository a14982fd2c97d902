import { Worker } from 'node:worker_threads';

/** Thrown when a task waited longer than the pool's queue allows, or the pool is closed. */
export class WorkerPoolBusyError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'WorkerPoolBusyError';
  }
}

interface Task<TIn, TOut> {
  input: TIn;
  resolve: (value: TOut) => void;
  reject: (error: Error) => void;
}

interface Slot<TIn, TOut> {
  worker: Worker;
  task: Task<TIn, TOut> | undefined;
  timer: NodeJS.Timeout | undefined;
  /** True once the thread has started: the task's time limit counts from then, not from spawning. */
  isOnline: boolean;
}

/** What a worker posts back: the result, or an error message (structured clone keeps no Error class). */
export type WorkerReply<TOut> = { ok: true; value: TOut } | { ok: false; message: string };

export interface WorkerPoolOptions {
  /** Worker threads, each running `script` (a module that answers every message with a WorkerReply). */
  threads: number;
  /** Longest one task may run; the worker is then ended and replaced, and the task fails. */
  taskTimeoutMs: number;
  /** Tasks that may wait for a free thread; beyond that `run` rejects at once with WorkerPoolBusyError. */
  maxQueue: number;
  name: string;
  /**
   * `at-once` (default): every thread starts with the pool, so the first task finds one ready.
   * `on-demand`: a thread starts when a task finds none free, up to `threads`: a process that never runs a
   * task never pays for loading the script (each test app; a drawing thread costs about 1.7 s of CPU).
   */
  start?: 'at-once' | 'on-demand';
}

/**
 * A fixed set of worker threads taking one task each, with a FIFO queue in front. CPU-heavy work (graph
 * layout, SVG serialisation) runs there so the event loop keeps answering requests. A worker that
 * crashes or overruns is replaced; its task fails, the others carry on.
 */
export class WorkerPool<TIn, TOut> {
  private readonly slots: Slot<TIn, TOut>[] = [];
  private readonly queue: Task<TIn, TOut>[] = [];
  private isClosed = false;

  constructor(
    private readonly script: URL,
    private readonly options: WorkerPoolOptions,
  ) {
    if (options.start !== 'on-demand') for (let i = 0; i < options.threads; i += 1) this.slots.push(this.spawn());
  }

  /** Threads started (all of them unless `start` is `on-demand`). */
  get threads(): number {
    return this.slots.length;
  }

  /** Tasks running plus waiting. */
  get pending(): number {
    return this.queue.length + this.slots.filter((slot) => slot.task).length;
  }

  run(input: TIn): Promise<TOut> {
    if (this.isClosed) return Promise.reject(new WorkerPoolBusyError(`${this.options.name} is shut down`));
    if (this.queue.length >= this.options.maxQueue) {
      return Promise.reject(new WorkerPoolBusyError(`${this.options.name}: ${this.queue.length} tasks already waiting`));
    }
    return new Promise<TOut>((resolve, reject) => {
      this.queue.push({ input, resolve, reject });
      this.dispatch();
    });
  }

  async close(): Promise<void> {
    this.isClosed = true;
    for (const task of this.queue.splice(0)) task.reject(new WorkerPoolBusyError(`${this.options.name} is shut down`));
    await Promise.all(
      this.slots.map(async (slot) => {
        clearTimeout(slot.timer);
        slot.task?.reject(new WorkerPoolBusyError(`${this.options.name} is shut down`));
        slot.task = undefined;
        await slot.worker.terminate();
      }),
    );
  }

  private spawn(): Slot<TIn, TOut> {
    const worker = new Worker(this.script);
    // An idle worker must not keep the process alive on shutdown.
    worker.unref();
    const slot: Slot<TIn, TOut> = { worker, task: undefined, timer: undefined, isOnline: false };
    worker.once('online', () => {
      slot.isOnline = true;
      if (slot.task && !slot.timer) this.startTimer(slot);
    });
    worker.on('message', (reply: WorkerReply<TOut>) => {
      const task = slot.task;
      this.finish(slot);
      if (!task) return;
      if (reply.ok) task.resolve(reply.value);
      else task.reject(new Error(`${this.options.name}: ${reply.message}`));
      this.dispatch();
    });
    const replace = (error: Error) => {
      const task = slot.task;
      this.finish(slot);
      if (this.isClosed) return;
      void slot.worker.terminate();
      const index = this.slots.indexOf(slot);
      if (index >= 0) this.slots[index] = this.spawn();
      task?.reject(error);
      this.dispatch();
    };
    worker.on('error', (error) => replace(new Error(`${this.options.name}: worker failed: ${error.message}`)));
    worker.on('exit', (code) => {
      if (!this.isClosed && this.slots.includes(slot)) replace(new Error(`${this.options.name}: worker exited with code ${code}`));
    });
    return slot;
  }

  private finish(slot: Slot<TIn, TOut>): void {
    clearTimeout(slot.timer);
    slot.timer = undefined;
    slot.task = undefined;
    slot.worker.unref();
  }

  private dispatch(): void {
    const free = this.slots.filter((slot) => !slot.task).length;
    for (let i = free; i < this.queue.length && this.slots.length < this.options.threads; i += 1) this.slots.push(this.spawn());
    for (const slot of this.slots) {
      if (this.queue.length === 0) return;
      if (slot.task) continue;
      const task = this.queue.shift()!;
      slot.task = task;
      slot.worker.ref();
      if (slot.isOnline) this.startTimer(slot);
      slot.worker.postMessage(task.input);
    }
  }

  private startTimer(slot: Slot<TIn, TOut>): void {
    slot.timer = setTimeout(() => {
      const index = this.slots.indexOf(slot);
      const running = slot.task;
      this.finish(slot);
      void slot.worker.terminate();
      if (index >= 0 && !this.isClosed) this.slots[index] = this.spawn();
      running?.reject(new Error(`${this.options.name}: task took longer than ${this.options.taskTimeoutMs} ms`));
      this.dispatch();
    }, this.options.taskTimeoutMs);
  }
}
