import { describe, expect, it } from 'vitest';

import { safeNextPath } from './safe-next-path';

describe('safeNextPath', () => {
  it.each([
    ['/users', '/users'],
    ['/outbox?page=2', '/outbox?page=2'],
    ['/outbox/abc#part', '/outbox/abc#part'],
  ])('should keep the in-app path %j', (next, expected) => {
    expect(safeNextPath(next)).toBe(expected);
  });

  it.each([
    [null],
    [''],
    ['users'],
    ['//elsewhere.example/steal'],
    ['/\\elsewhere.example'],
    ['https://elsewhere.example/'],
    ['javascript:alert(1)'],
    ['/sign-in?next=/users'],
    ['/accept-invitation?token=x'],
  ])('should fall back to home for %j', (next) => {
    expect(safeNextPath(next)).toBe('/');
  });
});
