import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';

import { afterAll, describe, expect, it } from 'vitest';

import { WorkerPool, WorkerPoolBusyError } from './worker-pool.js';

// A worker that answers { n } with n * 2, spins for { spinMs }, throws for { fail }, exits for { exit }.
const dir = mkdtempSync(join(tmpdir(), 'loamline-worker-pool-'));
const script = pathToFileURL(join(dir, 'double.worker.mjs'));
writeFileSync(
  script,
  `import { parentPort, threadId } from 'node:worker_threads';
parentPort.on('message', (task) => {
  if (task.exit) process.exit(3);
  if (task.fail) return parentPort.postMessage({ ok: false, message: 'refused ' + task.n });
  const until = Date.now() + (task.spinMs ?? 0);
  while (Date.now() < until);
  parentPort.postMessage({ ok: true, value: { doubled: task.n * 2, threadId } });
});`,
);

type Task = { n: number; spinMs?: number; fail?: boolean; exit?: boolean };
type Out = { doubled: number; threadId: number };

// Threads take a while to start on a loaded machine: generous per-test limits.
describe(WorkerPool.name, { timeout: 60_000 }, () => {
  afterAll(() => rmSync(dir, { recursive: true, force: true }));

  it('should run tasks on its threads, in parallel and off this thread', async () => {
    const pool = new WorkerPool<Task, Out>(script, { threads: 2, taskTimeoutMs: 10_000, maxQueue: 10, name: 'test pool' });
    try {
      const results = await Promise.all([1, 2, 3, 4].map((n) => pool.run({ n, spinMs: 20 })));
      expect(results.map((r) => r.doubled)).toEqual([2, 4, 6, 8]);
      expect(new Set(results.map((r) => r.threadId)).size).toBe(2);
    } finally {
      await pool.close();
    }
  });

  it('should start no thread before the first task when on demand, then only as many as tasks need', async () => {
    const pool = new WorkerPool<Task, Out>(script, { threads: 2, taskTimeoutMs: 10_000, maxQueue: 10, name: 'test pool', start: 'on-demand' });
    try {
      expect(pool.threads).toBe(0);
      expect((await pool.run({ n: 1 })).doubled).toBe(2);
      expect(pool.threads).toBe(1);
      // One after another, the started thread is free each time: no second thread.
      expect((await pool.run({ n: 2 })).doubled).toBe(4);
      expect(pool.threads).toBe(1);
      // Three at once: a second thread starts, and no more than the pool's two.
      const results = await Promise.all([3, 4, 5].map((n) => pool.run({ n, spinMs: 50 })));
      expect(results.map((r) => r.doubled)).toEqual([6, 8, 10]);
      expect(pool.threads).toBe(2);
      expect(new Set(results.map((r) => r.threadId)).size).toBe(2);
    } finally {
      await pool.close();
    }
  });

  it('should start every thread with the pool by default', async () => {
    const pool = new WorkerPool<Task, Out>(script, { threads: 2, taskTimeoutMs: 10_000, maxQueue: 10, name: 'test pool' });
    try {
      expect(pool.threads).toBe(2);
    } finally {
      await pool.close();
    }
  });

  it('should fail only the task whose worker failed, times out or exits, and replace that worker', async () => {
    const pool = new WorkerPool<Task, Out>(script, { threads: 1, taskTimeoutMs: 2000, maxQueue: 10, name: 'test pool' });
    try {
      await expect(pool.run({ n: 1, fail: true })).rejects.toThrow('test pool: refused 1');
      await expect(pool.run({ n: 2, spinMs: 20_000 })).rejects.toThrow("longer than 2000 ms");
      await expect(pool.run({ n: 3, exit: true })).rejects.toThrow(/exited with code 3/);
      expect((await pool.run({ n: 4 })).doubled).toBe(8);
    } finally {
      await pool.close();
    }
  });

  it('should refuse at once beyond its queue, and everything after close', async () => {
    const pool = new WorkerPool<Task, Out>(script, { threads: 1, taskTimeoutMs: 10_000, maxQueue: 1, name: 'test pool' });
    const running = pool.run({ n: 1, spinMs: 200 });
    const waiting = pool.run({ n: 2 });
    await expect(pool.run({ n: 3 })).rejects.toBeInstanceOf(WorkerPoolBusyError);
    expect((await running).doubled).toBe(2);
    expect((await waiting).doubled).toBe(4);
    await pool.close();
    await expect(pool.run({ n: 4 })).rejects.toBeInstanceOf(WorkerPoolBusyError);
  });
});
