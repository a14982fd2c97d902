import { describe, expect, it, vi } from 'vitest';

import { type CursorPage, fetchAllPages, pageQuery } from './pages';

describe('fetchAllPages', () => {
  it('should follow nextCursor until a page has none, asking for the largest page', async () => {
    const pages: Record<string, CursorPage<number>> = {
      first: { items: [1, 2], total: 5, page: 1, pageSize: 100, nextCursor: 'c2' },
      c2: { items: [3, 4], total: 5, page: 2, pageSize: 100, nextCursor: 'c3' },
      c3: { items: [5], total: 5, page: 3, pageSize: 100, nextCursor: null },
    };
    const fetchPage = vi.fn(async (cursor: string | undefined) => pages[cursor ?? 'first']!);

    await expect(fetchAllPages(fetchPage)).resolves.toEqual([1, 2, 3, 4, 5]);
    expect(fetchPage.mock.calls).toEqual([
      [undefined, 100],
      ['c2', 100],
      ['c3', 100],
    ]);
  });

  it('should stop on the cursor, not the total, when rows come and go meanwhile', async () => {
    // The total said 2 on the first page, but a row was added before the walk ended: it is still fetched.
    const fetchPage = vi.fn(async (cursor: string | undefined) =>
      cursor ? { items: ['b', 'c'], total: 3, page: 2, pageSize: 1, nextCursor: null } : { items: ['a'], total: 2, page: 1, pageSize: 1, nextCursor: 'x' },
    );
    await expect(fetchAllPages(fetchPage)).resolves.toEqual(['a', 'b', 'c']);
  });
});

describe('pageQuery', () => {
  it('should leave out unset parameters and encode the rest', () => {
    expect(pageQuery({ cursor: undefined, pageSize: 100 })).toBe('?pageSize=100');
    expect(pageQuery({ q: 'a&b', cursor: 'ab_-', page: undefined })).toBe('?q=a%26b&cursor=ab_-');
    expect(pageQuery({ q: '' })).toBe('');
  });
});
