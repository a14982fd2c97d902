import { type CallHandler, type ExecutionContext, Injectable, type NestInterceptor } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import type { Request } from 'express';
import { finalize, type Observable } from 'rxjs';

import type { Env } from '../config/env.schema.js';
import { ConcurrencyLimiter } from './concurrency-limiter.js';
import type { AuthUser } from './decorators/current-user.decorator.js';
import { RetryLaterException } from './retry-later.exception.js';

/**
 * The one queue every image decode and resize in this process goes through (photos and site plans):
 * IMAGE_PROCESSING_CONCURRENCY at a time, the rest wait their turn. libvips runs on libuv's thread
 * pool (4 threads), which also serves file reads and other requests' work; keeping images to a share
 * of it (and of the cores) is what lets the API keep answering while photos process. Header checks
 * (type, size, limits) run before the queue, so a refused file never waits behind real work.
 */
@Injectable()
export class ImageWorkQueue {
  private readonly limiter: ConcurrencyLimiter;

  constructor(config: ConfigService<Env, true>) {
    this.limiter = new ConcurrencyLimiter({
      concurrency: config.get('IMAGE_PROCESSING_CONCURRENCY', { infer: true }),
      // Bounded by the per-user limit times the users uploading at once; beyond this, 503 SERVER_BUSY.
      maxQueue: 200,
      maxWaitMs: 120_000,
      name: 'image processing',
    });
  }

  run<T>(work: () => Promise<T>): Promise<T> {
    return this.limiter.run(work);
  }

  get queued(): number {
    return this.limiter.queued;
  }
}

/** Upload requests in flight per user, across photos and site plans (one instance per process). */
@Injectable()
export class UploadSlots {
  private readonly inFlight = new Map<string, number>();
  readonly maxPerUser: number;

  constructor(config: ConfigService<Env, true>) {
    this.maxPerUser = config.get('UPLOAD_MAX_CONCURRENT_PER_USER', { infer: true });
  }

  /** Takes a slot for `userId`, or answers false when the user already has `maxPerUser` in flight. */
  take(userId: string): boolean {
    const count = this.inFlight.get(userId) ?? 0;
    if (count >= this.maxPerUser) return false;
    this.inFlight.set(userId, count + 1);
    return true;
  }

  give(userId: string): void {
    const count = (this.inFlight.get(userId) ?? 1) - 1;
    if (count <= 0) this.inFlight.delete(userId);
    else this.inFlight.set(userId, count);
  }

  countOf(userId: string): number {
    return this.inFlight.get(userId) ?? 0;
  }
}

/** Seconds a refused upload is told to wait: about what one photo upload takes on a loaded server. */
export const UPLOAD_RETRY_AFTER_SECONDS = 5;

/**
 * Put outermost on an upload route (before Multer reads the body): a user with
 * UPLOAD_MAX_CONCURRENT_PER_USER uploads already in flight gets 429 `TOO_MANY_UPLOADS` with
 * Retry-After before any byte of the new body is buffered. The slot is given back when the request
 * ends, whether it succeeded, failed or the client went away.
 */
@Injectable()
export class UploadSlotInterceptor implements NestInterceptor {
  constructor(private readonly slots: UploadSlots) {}

  intercept(context: ExecutionContext, next: CallHandler): Observable<unknown> {
    const user = context.switchToHttp().getRequest<Request & { user?: AuthUser }>().user;
    if (!user) return next.handle();
    if (!this.slots.take(user.id)) {
      throw new RetryLaterException(
        429,
        {
          message: `You already have ${this.slots.maxPerUser} uploads in progress; at most ${this.slots.maxPerUser} at once are accepted (UPLOAD_MAX_CONCURRENT_PER_USER). Send this one when one of them has finished.`,
          code: 'TOO_MANY_UPLOADS',
        },
        UPLOAD_RETRY_AFTER_SECONDS,
      );
    }
    let isGiven = false;
    const give = () => {
      if (isGiven) return;
      isGiven = true;
      this.slots.give(user.id);
    };
    return next.handle().pipe(finalize(give));
  }
}
