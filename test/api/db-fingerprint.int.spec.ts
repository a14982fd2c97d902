import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { changedTables, fingerprintDatabase } from '../support/db-fingerprint.js';
import { withDb } from '../support/fixtures.js';

/**
 * The bad-input suite's "nothing was written" rests on this fingerprint (test/support/db-fingerprint.ts):
 * what it must see and what it must not, on a scratch table of the test database.
 */
describe('database fingerprint (what "nothing was written" means)', () => {
  const table = `fingerprint_probe_${process.pid}_${Date.now()}`;

  beforeAll(async () => {
    await withDb(async (db) => {
      await db.query(`create table public.${table} (id int primary key, note text)`);
      await db.query(`insert into public.${table} values (1, 'kept'), (2, 'kept')`);
    });
  });

  afterAll(async () => {
    await withDb((db) => db.query(`drop table if exists public.${table}`));
  });

  const changed = (work: (db: import('pg').Client) => Promise<unknown>) =>
    withDb(async (db) => {
      const before = await fingerprintDatabase(db);
      await work(db);
      return changedTables(before, await fingerprintDatabase(db)).filter((name) => name === table);
    });

  it('should see an insert, an update, a delete, and an update that writes the same value again', async () => {
    expect(await changed((db) => db.query(`insert into public.${table} values (3, 'new')`))).toEqual([table]);
    expect(await changed((db) => db.query(`update public.${table} set note = 'changed' where id = 3`))).toEqual([table]);
    expect(await changed((db) => db.query(`update public.${table} set note = note where id = 3`))).toEqual([table]);
    expect(await changed((db) => db.query(`delete from public.${table} where id = 3`))).toEqual([table]);
  });

  it('should not see a rolled-back transaction, a read, or an update of no row', async () => {
    expect(
      await changed(async (db) => {
        await db.query('begin');
        await db.query(`insert into public.${table} values (4, 'rolled back')`);
        await db.query(`update public.${table} set note = 'rolled back' where id = 1`);
        await db.query('rollback');
      }),
    ).toEqual([]);
    expect(await changed((db) => db.query(`select * from public.${table}`))).toEqual([]);
    expect(await changed((db) => db.query(`update public.${table} set note = 'x' where id = -1`))).toEqual([]);
  });

  it('should not see a vacuum of the table', async () => {
    await withDb((db) => db.query(`delete from public.${table} where id = 2`));
    expect(await changed((db) => db.query(`vacuum (freeze) public.${table}`))).toEqual([]);
  });
});
