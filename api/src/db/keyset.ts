import { type AnyColumn, type SQL, sql } from 'drizzle-orm';

import type { PageCursor } from '../domain/paging/page.schema.js';

/**
 * The rows after a cursor in a list ordered by `key` then `id`, both ascending: a row comparison, so
 * PostgreSQL compares the key with the column's own collation, exactly as the ORDER BY sorts it.
 * Undefined (no condition) without a cursor.
 */
export function afterCursor(key: AnyColumn, id: AnyColumn, cursor: PageCursor | undefined): SQL | undefined {
  if (!cursor) return undefined;
  return sql`(${key}, ${id}) > (${cursor.key}, ${cursor.id}::uuid)`;
}
