import type { SessionResponse, UserResponse } from '@domain/auth/auth.schema';
import type { Role } from '@domain/auth/roles';

import type { SessionUser } from '../lib/session';

/** Invented people of an invented company, one stable id per role. */
const IDS: Record<Role, string> = {
  admin: '0b7f3c1e-4a52-4d6b-9a11-2f5e8c7d9a01',
  office: '0b7f3c1e-4a52-4d6b-9a11-2f5e8c7d9a02',
  lead: '0b7f3c1e-4a52-4d6b-9a11-2f5e8c7d9a03',
  tech: '0b7f3c1e-4a52-4d6b-9a11-2f5e8c7d9a04',
  homeowner: '0b7f3c1e-4a52-4d6b-9a11-2f5e8c7d9a05',
};
const NAMES: Record<Role, string> = {
  admin: 'Wren Halloway',
  office: 'Tamsin Oakridge',
  lead: 'Ossian Brackley',
  tech: 'Ines Farrow',
  homeowner: 'Dara Penhallow',
};
export const COMPANY_ID = '5c0d2a9e-7f13-4b8e-a6c4-0e1d2f3a4b5c';
export const COMPANY_NAME = 'Fernhollow Garden Sound';

export function buildSessionUser(role: Role = 'lead', overrides: Partial<SessionUser> = {}): SessionUser {
  return {
    id: IDS[role],
    email: `${role}@fernhollow.example`,
    name: NAMES[role],
    role,
    companyId: COMPANY_ID,
    companyName: COMPANY_NAME,
    ...overrides,
  };
}

export function buildSessionResponse(user: SessionUser = buildSessionUser(), accessToken = 'access-1'): SessionResponse {
  return { accessToken, expiresInSeconds: 900, user };
}

export function buildUserResponse(role: Role, overrides: Partial<UserResponse> = {}): UserResponse {
  const user = buildSessionUser(role);
  return {
    id: user.id,
    email: user.email,
    name: user.name,
    role,
    isDisabled: false,
    lastSignInAt: '2026-03-02T08:15:00.000Z',
    createdAt: '2026-01-10T09:00:00.000Z',
    ...overrides,
  };
}

/** A list answer as the API pages it (`{ items, total, page, pageSize, nextCursor }`), all on page 1. */
export function buildPage<T>(items: T[], pageSize = 100): { items: T[]; total: number; page: number; pageSize: number; nextCursor: string | null } {
  return { items, total: items.length, page: 1, pageSize, nextCursor: null };
}
