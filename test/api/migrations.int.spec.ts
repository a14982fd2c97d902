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

  it('should keep a route bend\'s source and accuracy, existing bends without a source, and refuse a GPS bend without accuracy (0019)', async () => {
    const columns = await client.query(
      `select column_name, is_nullable, udt_name from information_schema.columns where table_name = 'run_route_points' and column_name in ('source', 'accuracy_m') order by column_name`,
    );
    expect(columns.rows).toEqual([
      { column_name: 'accuracy_m', is_nullable: 'YES', udt_name: 'float8' },
      { column_name: 'source', is_nullable: 'YES', udt_name: 'position_source' },
    ]);
    // The check constraints alone, without arranging a job and a run: replica mode skips foreign keys, not checks.
    await client.query('begin');
    try {
      await client.query(`set local session_replication_role = replica`);
      const run = '00000000-0000-4000-8000-000000000001';
      const insert = (ordinal: number, source: string | null, accuracy: number | null) =>
        client.query('insert into run_route_points (run_id, ordinal, x, y, source, accuracy_m) values ($1, $2, 0, 0, $3, $4)', [run, ordinal, source, accuracy]);
      await insert(0, null, null);
      await insert(1, 'gps', 3.5);
      await insert(2, 'manual', null);
      await client.query('savepoint before_bad');
      await expect(insert(3, 'gps', null)).rejects.toThrow(/run_route_points_gps_accuracy/);
      await client.query('rollback to savepoint before_bad');
      await expect(insert(4, 'gps', -1)).rejects.toThrow(/run_route_points_accuracy_nonnegative/);
    } finally {
      await client.query('rollback');
    }
  });

  it('should be idempotent when applied again', async () => {
    await migrate(url);
    const applied = await client.query('select count(*)::int as n from drizzle.__drizzle_migrations');
    expect(applied.rows[0].n).toBe(journal.entries.length);
  });
});
