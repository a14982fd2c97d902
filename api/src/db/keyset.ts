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

/**
 * The rows after a cursor in a list ordered by `key` (ascending or descending, with PostgreSQL's default
 * place for NULLs: last ascending, first descending) then `id` ascending — the order the jobs list sorts
 * in. A row comparison cannot mix directions, so the condition is spelt out; the cursor's key is compared
 * as the column's own type (the parameter takes the type of the column it meets) and collation. A null
 * key is the cursor of a row without a value. Undefined (no condition) without a cursor.
 */
export function afterSortedCursor(
  key: SQL | AnyColumn,
  id: AnyColumn,
  cursor: { key: string | null; id: string } | undefined,
  isDescending: boolean,
): SQL | undefined {
  if (!cursor) return undefined;
  const laterId = sql`${id} > ${cursor.id}::uuid`;
  if (cursor.key === null) {
    // Ascending, the NULLs come last: only later ones follow. Descending, they come first: every row
    // with a value follows them.
    return isDescending ? sql`((${key} is null and ${laterId}) or ${key} is not null)` : sql`(${key} is null and ${laterId})`;
  }
  const beyond = isDescending ? sql`${key} < ${cursor.key}` : sql`${key} > ${cursor.key}`;
  const after = sql`(${beyond} or (${key} = ${cursor.key} and ${laterId}))`;
  // Ascending, the rows without a value follow every row with one.
  return isDescending ? after : sql`(${after} or ${key} is null)`;
}
