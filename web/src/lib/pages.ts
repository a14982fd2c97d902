import type { Page } from '@domain/paging/page.schema';

export type { Page };

/** The largest page the API gives (PAGE_SIZE_MAX in @domain/paging/page.schema). */
export const LARGEST_PAGE = 100;

/**
 * Every item of a paged list, fetched a page at a time — for pickers and short lists that must show all
 * (a company's people, a customer's sites). A list people browse shows pages instead.
 */
export async function fetchAllPages<T>(fetchPage: (page: number, pageSize: number) => Promise<Page<T>>): Promise<T[]> {
  const items: T[] = [];
  for (let page = 1; ; page += 1) {
    const answer = await fetchPage(page, LARGEST_PAGE);
    items.push(...answer.items);
    if (answer.items.length === 0 || items.length >= answer.total) return items;
  }
}

/** `?page=…&pageSize=…` and any other set parameters, as a query string with its `?` (or ''). */
export function pageQuery(params: Record<string, string | number | undefined>): string {
  const search = new URLSearchParams();
  for (const [key, value] of Object.entries(params)) if (value !== undefined && value !== '') search.set(key, String(value));
  const query = search.toString();
  return query ? `?${query}` : '';
}
