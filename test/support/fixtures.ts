import { randomUUID } from 'node:crypto';

import { hash } from '@node-rs/argon2';
import pg from 'pg';
import { inject } from 'vitest';

import type { Role } from '../../api/src/domain/auth/roles.js';

export const TEST_PASSWORD = 'fixture-password-123';

export interface TestUser {
  id: string;
  email: string;
  name: string;
  role: Role;
  companyId: string;
}

export interface TestCompany {
  id: string;
  name: string;
  users: Record<Role, TestUser>;
}

let passwordHash: Promise<string> | undefined;

/** A direct connection to this project's test database, for arranging and inspecting rows. */
export async function withDb<T>(work: (client: pg.Client) => Promise<T>): Promise<T> {
  const client = new pg.Client({ connectionString: inject('databaseUrl') });
  await client.connect();
  try {
    return await work(client);
  } finally {
    await client.end();
  }
}

/** An invented company with one user per role, all with TEST_PASSWORD; e-mails are unique per call. */
export async function createCompany(label: string): Promise<TestCompany> {
  passwordHash ??= hash(TEST_PASSWORD);
  const suffix = randomUUID().slice(0, 8);
  return withDb(async (client) => {
    const name = `${label} ${suffix}`;
    const { rows } = await client.query('insert into companies (name) values ($1) returning id', [name]);
    const companyId = rows[0].id as string;
    const users = {} as Record<Role, TestUser>;
    for (const role of ['admin', 'office', 'lead', 'tech', 'homeowner'] as const) {
      users[role] = await insertUser(client, { companyId, role, email: `${role}.${suffix}@${label.toLowerCase().replace(/\W+/g, '-')}.example` });
    }
    return { id: companyId, name, users };
  });
}

export async function createUser(companyId: string, role: Role): Promise<TestUser> {
  passwordHash ??= hash(TEST_PASSWORD);
  return withDb((client) => insertUser(client, { companyId, role, email: `${role}.${randomUUID().slice(0, 8)}@extra.example` }));
}

async function insertUser(
  client: pg.Client,
  { companyId, role, email }: { companyId: string; role: Role; email: string },
): Promise<TestUser> {
  const name = `Test ${role}`;
  const { rows } = await client.query(
    'insert into users (company_id, email, name, role, password_hash) values ($1, $2, $3, $4, $5) returning id',
    [companyId, email, name, role, await passwordHash],
  );
  return { id: rows[0].id as string, email, name, role, companyId };
}
