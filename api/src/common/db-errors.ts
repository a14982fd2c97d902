/** The SQLSTATE of a PostgreSQL error, whether raised directly or wrapped by Drizzle (`cause`). */
function sqlState(error: unknown): string | undefined {
  for (let e: unknown = error, depth = 0; e && depth < 3; e = (e as { cause?: unknown }).cause, depth += 1) {
    const code = (e as { code?: unknown }).code;
    if (typeof code === 'string' && /^[0-9A-Z]{5}$/.test(code)) return code;
  }
  return undefined;
}

/** A foreign-key violation: the row is still referenced (delete) or references something gone (insert). */
export function isForeignKeyViolation(error: unknown): boolean {
  return sqlState(error) === '23503';
}

export function isUniqueViolation(error: unknown): boolean {
  return sqlState(error) === '23505';
}

/**
 * When a pooled database client last came back after work, or a new connection opened (ms since the
 * epoch). The pool (db.module.ts) records it; the error filter reads it to tell "busy" from "down".
 */
let lastAnsweredAt = 0;

export function noteDatabaseAnswered(at = Date.now()): void {
  lastAnsweredAt = at;
}

/** How recently the database must have answered for a pool wait that timed out to count as "busy". */
export const DATABASE_ANSWER_WINDOW_MS = 15_000;

/** pg-pool's error when no client became free within `connectionTimeoutMillis` (all clients in use). */
const POOL_WAIT_TIMEOUT = /^timeout exceeded when trying to connect$/;

/**
 * A wait for a pooled client that timed out while the database is answering: every client was busy
 * with other requests. That is load, not an outage (503 `DATABASE_BUSY` with Retry-After), whereas a
 * refused or timed-out connection, or a pool wait while nothing has answered lately, is "unreachable".
 */
export function isDatabaseBusy(error: unknown, now = Date.now()): boolean {
  for (let e: unknown = error, depth = 0; e && depth < 4; e = (e as { cause?: unknown }).cause, depth += 1) {
    if (e instanceof Error && POOL_WAIT_TIMEOUT.test(e.message)) return now - lastAnsweredAt <= DATABASE_ANSWER_WINDOW_MS;
  }
  return false;
}
