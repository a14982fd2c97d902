import { z } from 'zod';

/**
 * One page of a list: the shape every list route shares (jobs, customers, sites, users). `page` is
 * 1-based; `total` counts every match, so a client knows how many pages there are and nothing is cut off
 * silently. The query takes `page` and `pageSize` (up to 100, default 25).
 *
 * Customers, sites and users also page by cursor: each page carries `nextCursor` (null on the last page),
 * and `?cursor=…` asks for the page after it. A cursor holds the sort key and id of the last row it
 * followed, so walking a list with it neither skips nor repeats a row when rows are added or removed
 * before it (an offset would). `page` in the answer is still the page's number counted from the first.
 *
 * Jobs page by cursor in the order the caller sorts them: their cursor also holds that sort (a key means
 * nothing in another order, so a cursor read in another sort is refused), and its key may be null where
 * the sort column is (a job without a start date).
 */
export const PAGE_SIZE_MAX = 100;
export const PAGE_SIZE_DEFAULT = 25;

/** Where a cursor's page starts: after the row with this sort key and id; `page` is that page's number. */
export interface PageCursor {
  key: string;
  id: string;
  page: number;
}

/**
 * The cursor of a list the caller sorts (jobs): where its page starts, and the sort it was read in. `key`
 * is the row's sort value as PostgreSQL writes it as text, null where the row has none.
 */
export interface SortedPageCursor {
  sort: string;
  key: string | null;
  id: string;
  page: number;
}

const CursorContentSchema = z.object({
  key: z.string().max(1000),
  id: z.uuid(),
  page: z.number().int().min(2).max(100_000),
});

const SortedCursorContentSchema = z.object({
  sort: z.string().min(1).max(40),
  key: z.string().max(1000).nullable(),
  id: z.uuid(),
  page: z.number().int().min(2).max(100_000),
});

/** base64url (RFC 4648 §5, no padding) of the JSON of `value`: safe in a query string as it is. */
function encodeToken(value: object): string {
  const bytes = new TextEncoder().encode(JSON.stringify(value));
  let binary = '';
  for (const byte of bytes) binary += String.fromCharCode(byte);
  return btoa(binary).replace(/\+/g, '-').replace(/\//g, '_').replace(/=+$/, '');
}

/** The value `schema` reads from the token `text`, or undefined when `text` is not one this API wrote. */
function decodeToken<T>(text: string, schema: z.ZodType<T>): T | undefined {
  if (!/^[A-Za-z0-9_-]+$/.test(text)) return undefined;
  try {
    const binary = atob(text.replace(/-/g, '+').replace(/_/g, '/'));
    const bytes = Uint8Array.from(binary, (c) => c.charCodeAt(0));
    const parsed = schema.safeParse(JSON.parse(new TextDecoder('utf-8', { fatal: true }).decode(bytes)));
    return parsed.success ? parsed.data : undefined;
  } catch {
    return undefined;
  }
}

/** The opaque `cursor` text (base64url of JSON). */
export function encodeCursor(cursor: PageCursor): string {
  return encodeToken({ key: cursor.key, id: cursor.id, page: cursor.page });
}

/** The cursor inside `text`, or undefined when `text` is not one this API wrote. */
export function decodeCursor(text: string): PageCursor | undefined {
  return decodeToken(text, CursorContentSchema);
}

/** The opaque `cursor` text of a list the caller sorts (base64url of JSON). */
export function encodeSortedCursor(cursor: SortedPageCursor): string {
  return encodeToken({ sort: cursor.sort, key: cursor.key, id: cursor.id, page: cursor.page });
}

/** The sorted list's cursor inside `text`, or undefined when `text` is not one this API wrote for such a list. */
export function decodeSortedCursor(text: string): SortedPageCursor | undefined {
  return decodeToken(text, SortedCursorContentSchema);
}

/** The `cursor` parameter: text that `decode` reads as a cursor, or 400 naming `cursor`. */
function cursorSchemaOf<C>(decode: (text: string) => C | undefined) {
  return z
    .string()
    .max(2000)
    .transform((text, ctx) => {
      const cursor = decode(text);
      if (!cursor) {
        ctx.addIssue({ code: 'custom', message: 'is not a cursor from this list (use nextCursor of the page before)' });
        return z.NEVER;
      }
      return cursor;
    });
}

export const PageQuerySchema = z.object({
  page: z.coerce.number().int().min(1).max(100_000).default(1),
  pageSize: z.coerce.number().int().min(1).max(PAGE_SIZE_MAX).default(PAGE_SIZE_DEFAULT),
});
export type PageQuery = z.infer<typeof PageQuerySchema>;

/**
 * The query of a list that pages by cursor as well: `pageSize`, and either `page` (from 1, default 1) or
 * `cursor` (the `nextCursor` of the page before), not both. Spread `cursorPageShape` into a list's query
 * object and finish it with `refineCursorPage`; `pageNumber(query)` is the page asked for.
 */
export const cursorPageShape = {
  page: z.coerce.number().int().min(1).max(100_000).optional(),
  pageSize: PageQuerySchema.shape.pageSize,
  cursor: cursorSchemaOf(decodeCursor).optional(),
};

/**
 * The paging part of a list the caller sorts (jobs): as `cursorPageShape`, with a cursor that holds its
 * sort. The list checks the cursor's sort against its own `sort` (`refineSortedCursor`).
 */
export const sortedCursorPageShape = {
  ...cursorPageShape,
  cursor: cursorSchemaOf(decodeSortedCursor).optional(),
};

/**
 * Refuses a cursor read in another sort than the query's `sort`, or with no key where the sort column
 * never lacks one (400 naming `cursor`): its key would be compared with another column's values.
 */
export function refineSortedCursor<S extends z.ZodObject>(schema: S, nullableSorts: readonly string[]): S {
  return schema.refine(
    (query) => {
      const { cursor, sort } = query as { cursor?: SortedPageCursor; sort?: string };
      if (!cursor) return true;
      return cursor.sort === sort && (cursor.key !== null || nullableSorts.includes(cursor.sort.replace(/^-/, '')));
    },
    { error: 'was read in another sort (start again without a cursor)', path: ['cursor'] },
  );
}

/** Refuses `page` and `cursor` together (400 naming `cursor`). */
export function refineCursorPage<S extends z.ZodObject>(schema: S): S {
  return schema.refine((query) => !('page' in query && query.page !== undefined && 'cursor' in query && query.cursor !== undefined), {
    error: 'send either page or cursor, not both',
    path: ['cursor'],
  });
}

export const CursorPageQuerySchema = refineCursorPage(z.object(cursorPageShape));
export type CursorPageQuery = z.infer<typeof CursorPageQuerySchema>;

/** What the paging helpers read of a cursor-paged list's query (its own cursor type aside). */
export interface CursorPaging {
  page?: number | undefined;
  pageSize: number;
  cursor?: { page: number } | undefined;
}

/** The number of the page a query asks for: the cursor's, or `page`, or 1. */
export function pageNumber(query: CursorPaging): number {
  return query.cursor?.page ?? query.page ?? 1;
}

export interface Page<T> {
  items: T[];
  total: number;
  page: number;
  pageSize: number;
}

/** A page of a list that pages by cursor as well: `nextCursor` asks for the page after it (null: none). */
export interface CursorPage<T> extends Page<T> {
  nextCursor: string | null;
}

export function pageOf<T>(items: T[], total: number, query: PageQuery): Page<T> {
  return { items, total, page: query.page, pageSize: query.pageSize };
}

/**
 * The page of a cursor-paged list from the rows a repository read with `cursorLimit` (one more than the
 * page holds, to know whether another page follows); `keyOf` gives a row's sort key, as the cursor keeps it.
 */
export function cursorPageOf<R extends { id: string }, T>(
  rows: R[],
  total: number,
  query: CursorPageQuery,
  keyOf: (row: R) => string,
  toItem: (row: R) => T,
): CursorPage<T> {
  return pageAfter(rows, total, query, (last, page) => encodeCursor({ key: keyOf(last), id: last.id, page }), toItem);
}

/**
 * `cursorPageOf` for a list the caller sorts (jobs): the next cursor holds `query.sort`, and `keyOf` gives
 * the row's value of that sort's column as text (null where it has none).
 */
export function sortedCursorPageOf<R extends { id: string }, T>(
  rows: R[],
  total: number,
  query: CursorPaging & { sort: string },
  keyOf: (row: R) => string | null,
  toItem: (row: R) => T,
): CursorPage<T> {
  return pageAfter(rows, total, query, (last, page) => encodeSortedCursor({ sort: query.sort, key: keyOf(last), id: last.id, page }), toItem);
}

function pageAfter<R, T>(
  rows: R[],
  total: number,
  query: CursorPaging,
  cursorAfter: (last: R, page: number) => string,
  toItem: (row: R) => T,
): CursorPage<T> {
  const pageRows = rows.slice(0, query.pageSize);
  const last = pageRows.at(-1);
  const page = pageNumber(query);
  const nextCursor = rows.length > query.pageSize && last !== undefined ? cursorAfter(last, page + 1) : null;
  return { items: pageRows.map(toItem), total, page, pageSize: query.pageSize, nextCursor };
}

/** How many rows a repository reads for one cursor page: one more than it holds. */
export function cursorLimit(query: CursorPaging): number {
  return query.pageSize + 1;
}

/** The row offset of a page. */
export function pageOffset(query: PageQuery): number {
  return (query.page - 1) * query.pageSize;
}

/** The row offset of a cursor-paged list's page: 0 with a cursor (the cursor says where it starts). */
export function cursorPageOffset(query: CursorPaging): number {
  return query.cursor ? 0 : (pageNumber(query) - 1) * query.pageSize;
}

/** The response schema of one page of `item`s (the shape of `Page<T>`). */
export function pageSchemaOf<T extends z.ZodType>(item: T) {
  return z.object({ items: z.array(item), total: z.number().int(), page: z.number().int(), pageSize: z.number().int() });
}

/** The response schema of one page of a list that pages by cursor as well (the shape of `CursorPage<T>`). */
export function cursorPageSchemaOf<T extends z.ZodType>(item: T) {
  return pageSchemaOf(item).extend({ nextCursor: z.string().nullable() });
}
