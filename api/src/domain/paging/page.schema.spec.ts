import { describe, expect, it } from 'vitest';

import { CursorPageQuerySchema, cursorPageOf, decodeCursor, encodeCursor, pageNumber } from './page.schema.js';

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
