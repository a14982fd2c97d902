import type { ConfigService } from '@nestjs/config';
import { beforeEach, describe, expect, it, vi } from 'vitest';

import type { Env } from '../config/env.schema.js';

/** A stand-in for pg-boss that records what the queues do with it. */
const boss = vi.hoisted(() => {
  const instances: FakeBoss[] = [];
  class FakeBoss {
    readonly calls: string[] = [];
    private workers = 0;
    constructor(readonly options: Record<string, unknown>) {
      instances.push(this);
    }
    on() {}
    async start() {
      this.calls.push('start');
      // Slow enough that several queues ask for it before it is up (they raced before).
      await new Promise((resolve) => setTimeout(resolve, 20));
    }
    async createQueue(name: string) {
      this.calls.push(`createQueue ${name}`);
    }
    async send(name: string) {
      this.calls.push(`send ${name}`);
    }
    async work(name: string) {
      this.workers += 1;
      this.calls.push(`work ${name}`);
      return `${name}-worker-${this.workers}`;
    }
    async offWork(options: { id: string }) {
      this.calls.push(`offWork ${options.id}`);
    }
    async stop() {
      this.calls.push('stop');
    }
  }
  return { instances, FakeBoss };
});

vi.mock('pg-boss', () => ({ default: boss.FakeBoss }));

const { PgBossQueue } = await import('./pg-boss-queue.js');

const config = {
  get: (key: keyof Env) =>
    ({ DATABASE_URL: 'postgres://queue-test/db', QUEUE_MAINTENANCE_INTERVAL_SECONDS: 120, QUEUE_POLL_INTERVAL_SECONDS: 1 })[key as string],
} as unknown as ConfigService<Env, true>;

class NamedQueue extends PgBossQueue<{ id: string }> {
  constructor(private readonly name: string) {
    super(config);
  }
  protected settings() {
    return { name: this.name, retryLimit: 1, retryDelay: 1, expireInSeconds: 60 };
  }
}

describe('PgBossQueue', () => {
  beforeEach(() => {
    boss.instances.length = 0;
  });

  it('should start one pg-boss instance for all the queues of a process and create each queue once', async () => {
    const queues = ['packet-render', 'packet-send', 'account-mail'].map((name) => new NamedQueue(name));

    await Promise.all(queues.flatMap((queue) => [queue.enqueue({ id: 'a' }), queue.enqueue({ id: 'b' })]));

    expect(boss.instances).toHaveLength(1);
    const calls = boss.instances[0]!.calls;
    expect(calls.filter((c) => c === 'start')).toHaveLength(1);
    expect(calls.filter((c) => c.startsWith('createQueue')).sort()).toEqual([
      'createQueue account-mail',
      'createQueue packet-render',
      'createQueue packet-send',
    ]);
    expect(calls.filter((c) => c.startsWith('send'))).toHaveLength(6);
    expect(boss.instances[0]!.options).toMatchObject({ schema: 'pgboss', application_name: 'loamline-queue' });

    for (const queue of queues) await queue.beforeApplicationShutdown();
  });

  it("should stop each queue's own workers, and the instance only when the last queue stops", async () => {
    const render = new NamedQueue('packet-render');
    const mail = new NamedQueue('account-mail');
    await render.work(2, async () => undefined);
    await mail.work(1, async () => undefined);
    const calls = boss.instances[0]!.calls;

    await render.beforeApplicationShutdown();
    expect(calls.filter((c) => c.startsWith('offWork'))).toEqual(['offWork packet-render-worker-1', 'offWork packet-render-worker-2']);
    expect(calls).not.toContain('stop');

    await mail.beforeApplicationShutdown();
    expect(calls.filter((c) => c.startsWith('offWork'))).toHaveLength(3);
    expect(calls.filter((c) => c === 'stop')).toHaveLength(1);

    // A queue used after that starts a fresh instance.
    await new NamedQueue('packet-send').enqueue({ id: 'c' });
    expect(boss.instances).toHaveLength(2);
  });
});
