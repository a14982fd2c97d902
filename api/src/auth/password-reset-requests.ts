import { type BeforeApplicationShutdown, Injectable, Logger } from '@nestjs/common';

/** Requests waiting beyond this are dropped with a warning (the sign-in limits keep it unreachable in practice). */
const MAX_WAITING = 1_000;
/** How long shutdown waits for requests already accepted. */
const DRAIN_TIMEOUT_MS = 10_000;

/**
 * Password-reset requests, taken in before anything is looked up and worked one at a time in the
 * background of this process. The request for an address with an account and the one for an address
 * without do exactly the same work before the answer (`add` below: push onto an array), so the answer's
 * timing tells nothing about who has an account.
 *
 * In process rather than on the pg-boss queue on purpose: the typed address never lands in a table
 * (queue jobs are kept, and archived, for days), and the step is short — the lookup, and for a real
 * account the reset row with its e-mail queued durably on the account-mail queue. A process that dies
 * in the milliseconds between answer and lookup loses that one request; the person asks again.
 */
@Injectable()
export class PasswordResetRequests implements BeforeApplicationShutdown {
  private readonly logger = new Logger(PasswordResetRequests.name);
  private readonly waiting: string[] = [];
  private worker: ((email: string) => Promise<void>) | undefined;
  private running: Promise<void> | undefined;

  /** Who works the requests (AuthService, which owns the lookup and the reset rows). */
  setWorker(worker: (email: string) => Promise<void>): void {
    this.worker = worker;
  }

  add(email: string): void {
    if (this.waiting.length >= MAX_WAITING) {
      this.logger.warn('password-reset requests are arriving faster than they are worked; one was dropped');
      return;
    }
    this.waiting.push(email);
    this.running ??= this.drain().finally(() => {
      this.running = undefined;
    });
  }

  /** Resolves once every request taken in so far has been worked (tests, shutdown). */
  async idle(): Promise<void> {
    while (this.running) await this.running;
  }

  async beforeApplicationShutdown(): Promise<void> {
    let timer: NodeJS.Timeout | undefined;
    await Promise.race([this.idle(), new Promise((resolve) => (timer = setTimeout(resolve, DRAIN_TIMEOUT_MS)))]);
    clearTimeout(timer);
  }

  private async drain(): Promise<void> {
    // Never in the request's own tick: the answer goes first.
    await new Promise((resolve) => setImmediate(resolve));
    for (let email = this.waiting.shift(); email !== undefined; email = this.waiting.shift()) {
      try {
        await this.worker?.(email);
      } catch (error) {
        this.logger.error(`a password-reset request failed: ${error instanceof Error ? error.message : String(error)}`);
      }
    }
  }
}
