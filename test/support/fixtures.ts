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

/**
 * Argon2id at the algorithm's floor (1 MiB, one pass) for the fixture users only: the API verifies with
 * the parameters stored in the hash, so each sign-in of a fixture user costs milliseconds instead of the
 * production 19 MiB × 2 passes (about 0.2 s of one core each under test load). Hashes the API makes itself
 * (invitations, resets, sign-ups) keep the production parameters; these must never be used outside tests.
 */
const TEST_HASH_OPTIONS = { memoryCost: 1024, timeCost: 1, parallelism: 1 } as const;

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
  passwordHash ??= hash(TEST_PASSWORD, TEST_HASH_OPTIONS);
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
  passwordHash ??= hash(TEST_PASSWORD, TEST_HASH_OPTIONS);
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
