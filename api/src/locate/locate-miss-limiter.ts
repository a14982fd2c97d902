import { Injectable } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';

import type { Env } from '../config/env.schema.js';

const WINDOW_MS = 60_000;
/** Most client addresses tracked at once; the oldest windows are dropped first beyond it. */
const MAX_TRACKED = 10_000;

/**
 * Counts failed locate-token lookups per client address in a one-minute window. Past the limit the
 * address is refused (429) on every locate request — valid token or not — until the window ends, so a
 * guesser learns nothing more. Kept in process memory, like @nestjs/throttler's default storage (which
 * counts every request, not only failures); with several API instances each keeps its own count.
 */
@Injectable()
export class LocateMissLimiter {
  private readonly windows = new Map<string, { count: number; startedAt: number }>();
  private readonly limit: number;

  constructor(config: ConfigService<Env, true>) {
    this.limit = config.get('LOCATE_FAILED_LOOKUPS_PER_MINUTE', { infer: true });
  }

  isBlocked(address: string, now = Date.now()): boolean {
    const window = this.current(address, now);
    return window !== undefined && window.count >= this.limit;
  }

  /** Records one failed lookup (the request after the limit-th one is refused). */
  recordMiss(address: string, now = Date.now()): void {
    const window = this.current(address, now) ?? { count: 0, startedAt: now };
    window.count += 1;
    this.windows.delete(address);
    this.windows.set(address, window);
    if (this.windows.size > MAX_TRACKED) this.windows.delete(this.windows.keys().next().value!);
  }

  private current(address: string, now: number) {
    const window = this.windows.get(address);
    if (window && now - window.startedAt >= WINDOW_MS) {
      this.windows.delete(address);
      return undefined;
    }
    return window;
  }
}
