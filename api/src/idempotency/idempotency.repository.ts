import { Inject, Injectable } from '@nestjs/common';
import { and, eq, lt, sql } from 'drizzle-orm';

import { DB, type Db } from '../db/db.module.js';
import { idempotencyKeys, type IdempotencyKeyRow } from '../db/schema/index.js';

/** How long a kept answer can be replayed: a phone out of signal for a day still replays exactly once. */
export const IDEMPOTENCY_TTL_HOURS = 24;

export type IdempotencyClaim = { userId: string; key: string; method: string; path: string; requestHash: string };

@Injectable()
export class IdempotencyRepository {
  constructor(@Inject(DB) private readonly db: Db) {}

  /**
   * Claims `key` for the user: true when this request is the first to use it (in the last 24 h).
   * Expired keys of the same user are dropped first, so a key may be used again after a day.
   */
  async claim(claim: IdempotencyClaim): Promise<boolean> {
    await this.db
      .delete(idempotencyKeys)
      .where(and(eq(idempotencyKeys.userId, claim.userId), lt(idempotencyKeys.createdAt, sql`now() - make_interval(hours => ${IDEMPOTENCY_TTL_HOURS})`)));
    const inserted = await this.db.insert(idempotencyKeys).values(claim).onConflictDoNothing().returning({ key: idempotencyKeys.key });
    return inserted.length === 1;
  }

  /** The kept row for the user's key, with its age in seconds. */
  async find(userId: string, key: string): Promise<(IdempotencyKeyRow & { ageSeconds: number }) | undefined> {
    const [row] = await this.db
      .select({ row: idempotencyKeys, ageSeconds: sql<number>`extract(epoch from now() - ${idempotencyKeys.createdAt})::float8` })
      .from(idempotencyKeys)
      .where(and(eq(idempotencyKeys.userId, userId), eq(idempotencyKeys.key, key)));
    return row ? { ...row.row, ageSeconds: Number(row.ageSeconds) } : undefined;
  }

  /** Keeps the answer of the request that claimed the key. */
  async complete(userId: string, key: string, statusCode: number, responseBody: unknown): Promise<void> {
    await this.db
      .update(idempotencyKeys)
      .set({ statusCode, responseBody: responseBody === undefined ? null : (responseBody as object) })
      .where(and(eq(idempotencyKeys.userId, userId), eq(idempotencyKeys.key, key)));
  }

  /** Lets the key go after the request failed, so the same change can be sent again (after a conflict). */
  async release(userId: string, key: string): Promise<void> {
    await this.db.delete(idempotencyKeys).where(and(eq(idempotencyKeys.userId, userId), eq(idempotencyKeys.key, key)));
  }
}
