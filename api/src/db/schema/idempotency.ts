import { sql } from 'drizzle-orm';
import { index, integer, jsonb, pgTable, primaryKey, text, timestamp, uuid } from 'drizzle-orm/pg-core';

import { users } from './users.js';

/**
 * A write sent with an `Idempotency-Key` header (api/src/idempotency): the first request claims the
 * key for its user; once the route answers 2xx the answer is kept, and a repeat of the same request
 * (the phone's offline queue re-sending after a lost answer) gets that answer back instead of running
 * again. Kept 24 hours. `status_code` is null while the first request is still running.
 */
export const idempotencyKeys = pgTable(
  'idempotency_keys',
  {
    userId: uuid('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    key: text('key').notNull(),
    method: text('method').notNull(),
    path: text('path').notNull(),
    /** SHA-256 of the request body: the same key with another body is a client bug, refused. */
    requestHash: text('request_hash').notNull(),
    statusCode: integer('status_code'),
    responseBody: jsonb('response_body'),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().default(sql`now()`),
  },
  (t) => [primaryKey({ columns: [t.userId, t.key] }), index('idempotency_keys_created_at_idx').on(t.createdAt)],
);

export type IdempotencyKeyRow = typeof idempotencyKeys.$inferSelect;
