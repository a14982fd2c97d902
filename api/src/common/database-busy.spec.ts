import type { ArgumentsHost } from '@nestjs/common';
import { describe, expect, it, vi } from 'vitest';

import { ConcurrencyLimiter, LimiterBusyError } from './concurrency-limiter.js';
import { DATABASE_ANSWER_WINDOW_MS, isDatabaseBusy, noteDatabaseAnswered } from './db-errors.js';
import { HttpExceptionFilter } from './http-exception.filter.js';
import { RetryLaterException } from './retry-later.exception.js';

function host() {
  const res = { headersSent: false, status: vi.fn(), json: vi.fn(), setHeader: vi.fn() };
  res.status.mockReturnValue(res);
  const value = { switchToHttp: () => ({ getResponse: () => res, getRequest: () => ({ params: {} }) }) } as unknown as ArgumentsHost;
  return { host: value, res };
}

/** pg-pool's own words when no pooled client became free in time (pg-pool/index.js, `connect`). */
const poolWaitTimeout = () => new Error('timeout exceeded when trying to connect');
/** How Drizzle wraps a driver error: "Failed query: …" with the original as `cause`. */
const wrapped = (cause: Error) => Object.assign(new Error('Failed query: select 1'), { cause });

// Issue 18 §3: 200 drawing requests made requests wait for a pooled connection; the timeout was
// reported as "the database is not reachable" while the database was answering all along.
describe('a pool wait that times out', () => {
  const filter = new HttpExceptionFilter();

  it('should be "busy" (503 DATABASE_BUSY, Retry-After) while the database has answered lately', () => {
    noteDatabaseAnswered();
    expect(isDatabaseBusy(poolWaitTimeout())).toBe(true);
    expect(isDatabaseBusy(wrapped(poolWaitTimeout()))).toBe(true);
    const { host: h, res } = host();
    filter.catch(wrapped(poolWaitTimeout()), h);
    expect(res.status).toHaveBeenCalledWith(503);
    expect(res.json).toHaveBeenCalledWith(expect.objectContaining({ statusCode: 503, code: 'DATABASE_BUSY' }));
    expect(res.setHeader).toHaveBeenCalledWith('Retry-After', '2');
  });

  it('should stay "unavailable" when nothing has answered within the window', () => {
    const now = Date.now();
    noteDatabaseAnswered(now - DATABASE_ANSWER_WINDOW_MS - 1);
    expect(isDatabaseBusy(poolWaitTimeout(), now)).toBe(false);
    noteDatabaseAnswered(now - 100);
    expect(isDatabaseBusy(poolWaitTimeout(), now)).toBe(true);
    noteDatabaseAnswered(0);
    const { host: h, res } = host();
    filter.catch(poolWaitTimeout(), h);
    expect(res.json).toHaveBeenCalledWith(expect.objectContaining({ statusCode: 503, code: 'DATABASE_UNAVAILABLE' }));
  });

  it('should never call a refused or timed-out connection "busy"', () => {
    noteDatabaseAnswered();
    expect(isDatabaseBusy(Object.assign(new Error('connect ECONNREFUSED 127.0.0.1:5432'), { code: 'ECONNREFUSED' }))).toBe(false);
    expect(isDatabaseBusy(new Error('Connection terminated due to connection timeout'))).toBe(false);
    const { host: h, res } = host();
    filter.catch(Object.assign(new Error('connect ECONNREFUSED 127.0.0.1:5432'), { code: 'ECONNREFUSED' }), h);
    expect(res.json).toHaveBeenCalledWith(expect.objectContaining({ code: 'DATABASE_UNAVAILABLE' }));
  });

  it('should send Retry-After with a RetryLaterException', () => {
    const { host: h, res } = host();
    filter.catch(new RetryLaterException(429, { message: 'Too many uploads at once.', code: 'TOO_MANY_UPLOADS' }, 7), h);
    expect(res.status).toHaveBeenCalledWith(429);
    expect(res.setHeader).toHaveBeenCalledWith('Retry-After', '7');
    expect(res.json).toHaveBeenCalledWith(expect.objectContaining({ statusCode: 429, code: 'TOO_MANY_UPLOADS', error: 'Too Many Requests' }));
  });
});

describe(ConcurrencyLimiter.name, () => {
  it('should run at most `concurrency` tasks, queue the next ones in order and refuse beyond the queue', async () => {
    const limiter = new ConcurrencyLimiter({ concurrency: 2, maxQueue: 2, maxWaitMs: 10_000, name: 'test' });
    const gates: (() => void)[] = [];
    const order: number[] = [];
    const task = (n: number) =>
      limiter.run(
        () =>
          new Promise<number>((resolve) => {
            order.push(n);
            gates.push(() => resolve(n));
          }),
      );
    const runs = [task(1), task(2), task(3), task(4)];
    await expect(task(5)).rejects.toBeInstanceOf(LimiterBusyError);
    await Promise.resolve();
    expect(order).toEqual([1, 2]);
    expect(limiter.queued).toBe(2);
    gates[0]!();
    await runs[0];
    await new Promise((r) => setTimeout(r, 0));
    expect(order).toEqual([1, 2, 3]);
    gates[1]!();
    gates[2]!();
    await new Promise((r) => setTimeout(r, 0));
    gates[3]!();
    expect(await Promise.all(runs)).toEqual([1, 2, 3, 4]);
    expect(limiter.running).toBe(0);
  });

  it('should refuse a task that waited longer than maxWaitMs, without running it', async () => {
    vi.useFakeTimers();
    try {
      const limiter = new ConcurrencyLimiter({ concurrency: 1, maxQueue: 5, maxWaitMs: 1000, name: 'test' });
      let release: () => void = () => undefined;
      const first = limiter.run(() => new Promise<void>((resolve) => (release = resolve)));
      const work = vi.fn(async () => 'ran');
      const second = limiter.run(work);
      const refused = expect(second).rejects.toMatchObject({ name: 'LimiterBusyError', retryAfterSeconds: 1 });
      await vi.advanceTimersByTimeAsync(1001);
      await refused;
      expect(work).not.toHaveBeenCalled();
      release();
      await first;
      expect(await limiter.run(async () => 'next')).toBe('next');
    } finally {
      vi.useRealTimers();
    }
  });
});
