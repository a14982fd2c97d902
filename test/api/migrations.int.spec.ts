import { readFileSync } from 'node:fs';

import pg from 'pg';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

// @ts-expect-error -- plain ESM script shared with `npm start`; no type declarations.
import { ensureDatabase, ensurePostgres, migrate } from '../../scripts/lib/setup.mjs';

const journal = JSON.parse(readFileSync(new URL('../../drizzle/meta/_journal.json', import.meta.url), 'utf8')) as {
  entries: { tag: string }[];
};

describe('drizzle migrations', () => {
  const database = `loamline_test_empty_${process.pid}`;
  let url: string;
  let client: pg.Client;

  beforeAll(async () => {
    url = await ensureDatabase(ensurePostgres(), database, { fresh: true });
    client = new pg.Client({ connectionString: url });
    await client.connect();
  });

  afterAll(async () => {
    await client.end();
    const admin = new URL(url);
    admin.pathname = '/postgres';
    const adminClient = new pg.Client({ connectionString: admin.toString() });
    await adminClient.connect();
    await adminClient.query(`drop database if exists "${database}" with (force)`);
    await adminClient.end();
  });

  it('should apply every migration to an empty database', async () => {
    const before = await client.query(`select count(*)::int as n from pg_tables where schemaname = 'public'`);
    expect(before.rows[0].n).toBe(0);

    await migrate(url);

    const applied = await client.query('select count(*)::int as n from drizzle.__drizzle_migrations');
    expect(applied.rows[0].n).toBe(journal.entries.length);
    const tables = await client.query(`select tablename from pg_tables where schemaname = 'public'`);
    expect(tables.rows.map((r: { tablename: string }) => r.tablename)).toContain('companies');
  });

  it('should be idempotent when applied again', async () => {
    await migrate(url);
    const applied = await client.query('select count(*)::int as n from drizzle.__drizzle_migrations');
    expect(applied.rows[0].n).toBe(journal.entries.length);
  });
});
