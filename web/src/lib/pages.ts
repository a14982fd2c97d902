import type { CursorPage, Page } from '@domain/paging/page.schema';

export type { CursorPage, Page };

/** The largest page the API gives (PAGE_SIZE_MAX in @domain/paging/page.schema). */
export const LARGEST_PAGE = 100;

/**
 * Every item of a list that pages by cursor, fetched a page at a time — for pickers and short lists that
 * must show all (a company's people, a customer's sites). The cursor carries on after the last row read,
 * so a row added or removed meanwhile neither repeats nor hides another. A list people browse shows pages.
 */
export async function fetchAllPages<T>(fetchPage: (cursor: string | undefined, pageSize: number) => Promise<CursorPage<T>>): Promise<T[]> {
  const items: T[] = [];
  let cursor: string | undefined;
  do {
    const answer = await fetchPage(cursor, LARGEST_PAGE);
    items.push(...answer.items);
    cursor = answer.nextCursor ?? undefined;
  } while (cursor);
  return items;
}

/** `?page=…&pageSize=…` and any other set parameters, as a query string with its `?` (or ''). */
export function pageQuery(params: Record<string, string | number | undefined>): string {
  const search = new URLSearchParams();
  for (const [key, value] of Object.entries(params)) if (value !== undefined && value !== '') search.set(key, String(value));
  const query = search.toString();
  return query ? `?${query}` : '';
}
