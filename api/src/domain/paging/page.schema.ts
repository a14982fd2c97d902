import { z } from 'zod';

/**
 * One page of a list: the shape every list route shares (jobs, customers, sites, users). `page` is
 * 1-based; `total` counts every match, so a client knows how many pages there are and nothing is cut off
 * silently. The query takes `page` and `pageSize` (up to 100, default 25).
 */
export const PAGE_SIZE_MAX = 100;
export const PAGE_SIZE_DEFAULT = 25;

export const PageQuerySchema = z.object({
  page: z.coerce.number().int().min(1).max(100_000).default(1),
  pageSize: z.coerce.number().int().min(1).max(PAGE_SIZE_MAX).default(PAGE_SIZE_DEFAULT),
});
export type PageQuery = z.infer<typeof PageQuerySchema>;

export interface Page<T> {
  items: T[];
  total: number;
  page: number;
  pageSize: number;
}

export function pageOf<T>(items: T[], total: number, query: PageQuery): Page<T> {
  return { items, total, page: query.page, pageSize: query.pageSize };
}

/** The row offset of a page. */
export function pageOffset(query: PageQuery): number {
  return (query.page - 1) * query.pageSize;
}

/** The response schema of one page of `item`s (the shape of `Page<T>`). */
export function pageSchemaOf<T extends z.ZodType>(item: T) {
  return z.object({ items: z.array(item), total: z.number().int(), page: z.number().int(), pageSize: z.number().int() });
}
