import { describe, expect, it } from 'vitest';

import { canInvite, canManageUser, isStaffRole, type Role } from './roles.js';

describe(canInvite.name, () => {
  it.each<[Role, Role, boolean]>([
    ['admin', 'admin', true],
    ['admin', 'office', true],
    ['admin', 'homeowner', true],
    ['office', 'admin', false],
    ['office', 'lead', true],
    ['office', 'tech', true],
    ['office', 'homeowner', true],
    ['lead', 'tech', false],
    ['tech', 'tech', false],
    ['homeowner', 'homeowner', false],
  ])('should let %s invite %s: %s', (actor, invitee, expected) => {
    expect(canInvite(actor, invitee)).toBe(expected);
  });
});

describe(canManageUser.name, () => {
  it('should let an admin manage someone else but not themselves', () => {
    expect(canManageUser('admin', 'a', 'b')).toBe(true);
    expect(canManageUser('admin', 'a', 'a')).toBe(false);
  });

  it.each<Role>(['office', 'lead', 'tech', 'homeowner'])('should refuse %s', (role) => {
    expect(canManageUser(role, 'a', 'b')).toBe(false);
  });
});

describe(isStaffRole.name, () => {
  it('should treat every role but homeowner as staff', () => {
    expect(['admin', 'office', 'lead', 'tech', 'homeowner'].map((r) => isStaffRole(r as Role))).toEqual([
      true,
      true,
      true,
      true,
      false,
    ]);
  });
});
