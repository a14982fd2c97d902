import { describe, expect, it } from 'vitest';

import { z } from 'zod';

import {
  CursorPageQuerySchema,
  cursorPageOf,
  decodeCursor,
  decodeSortedCursor,
  encodeCursor,
  encodeSortedCursor,
  pageNumber,
  refineCursorPage,
  refineSortedCursor,
  sortedCursorPageOf,
  sortedCursorPageShape,
} from './page.schema.js';

const ID = '0b7f8a52-3c1e-4d7a-9a55-1f0f6b2f7c10';

describe('page cursors', () => {
  it.each(['Alder Row', 'Brambleño & Søns', 'quote " and / slash', '', '漢字 site'])('should read back the key %j it wrote', (key) => {
    const text = encodeCursor({ key, id: ID, page: 3 });
    // base64url alphabet without padding (RFC 4648 §5): safe in a query string as it is.
    expect(text).toMatch(/^[A-Za-z0-9_-]+$/);
    expect(decodeCursor(text)).toEqual({ key, id: ID, page: 3 });
  });

  it.each([
    ['not base64url', 'abc+/='],
    ['not JSON', btoa('nope').replace(/=+$/, '')],
    ['no uuid', encodeCursor({ key: 'a', id: 'x', page: 2 })],
    ['page 1 (a cursor always follows a page)', encodeCursor({ key: 'a', id: ID, page: 1 })],
  ])('should refuse a cursor that is %s', (_why, text) => {
    expect(decodeCursor(text)).toBeUndefined();
  });

  it('should refuse page and cursor together, naming cursor, and take the page number from the cursor', () => {
    const cursor = encodeCursor({ key: 'a', id: ID, page: 4 });
    const both = CursorPageQuerySchema.safeParse({ page: '2', cursor });
    expect(both.success).toBe(false);
    expect(both.error?.issues.map((issue) => issue.path)).toEqual([['cursor']]);
    const bad = CursorPageQuerySchema.safeParse({ cursor: 'nonsense!' });
    expect(bad.error?.issues.map((issue) => issue.path)).toEqual([['cursor']]);

    expect(pageNumber(CursorPageQuerySchema.parse({ cursor }))).toBe(4);
    expect(pageNumber(CursorPageQuerySchema.parse({ page: '2' }))).toBe(2);
    expect(pageNumber(CursorPageQuerySchema.parse({}))).toBe(1);
  });
});

describe(cursorPageOf.name, () => {
  const rows = [
    { id: ID, name: 'Alder' },
    { id: '1c0e3f8e-5b8a-4f55-8d7e-3a4b5c6d7e8f', name: 'Birch' },
    { id: '2d1f4a9f-6c9b-4a66-9e8f-4b5c6d7e8f90', name: 'Cedar' },
  ];

  it('should keep the page size and point the next cursor after its last row when one more row was read', () => {
    const page = cursorPageOf(rows, 7, CursorPageQuerySchema.parse({ pageSize: '2' }), (row) => row.name, (row) => row.name);
    expect(page).toMatchObject({ items: ['Alder', 'Birch'], total: 7, page: 1, pageSize: 2 });
    expect(decodeCursor(page.nextCursor!)).toEqual({ key: 'Birch', id: rows[1]!.id, page: 2 });
  });

  it('should give no cursor on the last page', () => {
    const page = cursorPageOf(rows, 3, CursorPageQuerySchema.parse({ pageSize: '3' }), (row) => row.name, (row) => row.name);
    expect(page).toMatchObject({ items: ['Alder', 'Birch', 'Cedar'], nextCursor: null });
  });
});

describe('sorted page cursors (jobs)', () => {
  const SortedQuerySchema = refineSortedCursor(refineCursorPage(z.object({ sort: z.string().default('title'), ...sortedCursorPageShape })), ['startDate']);

  it.each([
    ['-startDate', null],
    ['startDate', '2026-05-11'],
    ['-updatedAt', '2026-12-03 14:27:52.123456+00'],
  ])('should read back the sort %j and key %j it wrote', (sort, key) => {
    const text = encodeSortedCursor({ sort, key, id: ID, page: 2 });
    expect(text).toMatch(/^[A-Za-z0-9_-]+$/);
    expect(decodeSortedCursor(text)).toEqual({ sort, key, id: ID, page: 2 });
  });

  it('should tell a sorted cursor from a plain one, both ways', () => {
    expect(decodeSortedCursor(encodeCursor({ key: 'a', id: ID, page: 2 }))).toBeUndefined();
    expect(SortedQuerySchema.safeParse({ cursor: encodeCursor({ key: 'a', id: ID, page: 2 }) }).error?.issues.map((i) => i.path)).toEqual([['cursor']]);
    expect(CursorPageQuerySchema.safeParse({ cursor: encodeSortedCursor({ sort: 'title', key: null, id: ID, page: 2 }) }).success).toBe(false);
  });

  it.each([
    ['another sort', { sort: 'title' }, encodeSortedCursor({ sort: '-title', key: 'a', id: ID, page: 2 })],
    ['no key where the sort column always has one', { sort: 'title' }, encodeSortedCursor({ sort: 'title', key: null, id: ID, page: 2 })],
    ['a page as well', { sort: 'title', page: '2' }, encodeSortedCursor({ sort: 'title', key: 'a', id: ID, page: 2 })],
  ])('should refuse a cursor with %s, naming cursor', (_why, query, cursor) => {
    expect(SortedQuerySchema.safeParse({ ...query, cursor }).error?.issues.map((i) => i.path)).toEqual([['cursor']]);
  });

  it('should take a cursor without a key in a sort whose column may be empty, and its page number', () => {
    const query = SortedQuerySchema.parse({ sort: '-startDate', cursor: encodeSortedCursor({ sort: '-startDate', key: null, id: ID, page: 5 }) });
    expect(query.cursor).toEqual({ sort: '-startDate', key: null, id: ID, page: 5 });
    expect(pageNumber(query)).toBe(5);
  });

  it('should point the next cursor after the last row, in the query\'s sort, keeping a null key', () => {
    const rows = [
      { id: ID, start: '2026-01-02' },
      { id: '1c0e3f8e-5b8a-4f55-8d7e-3a4b5c6d7e8f', start: null },
      { id: '2d1f4a9f-6c9b-4a66-9e8f-4b5c6d7e8f90', start: null },
    ];
    const query = SortedQuerySchema.parse({ sort: 'startDate', pageSize: '2' });
    const page = sortedCursorPageOf(rows, 3, query, (row) => row.start, (row) => row.id);
    expect(page).toMatchObject({ items: [rows[0]!.id, rows[1]!.id], total: 3, page: 1, pageSize: 2 });
    expect(decodeSortedCursor(page.nextCursor!)).toEqual({ sort: 'startDate', key: null, id: rows[1]!.id, page: 2 });
    expect(sortedCursorPageOf(rows, 3, SortedQuerySchema.parse({ sort: 'startDate', pageSize: '3' }), (row) => row.start, (row) => row.id).nextCursor).toBeNull();
  });
});
