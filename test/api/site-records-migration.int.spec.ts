import { randomUUID } from 'node:crypto';
import { cpSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

import { getTableColumns, type Table } from 'drizzle-orm';
import { drizzle } from 'drizzle-orm/node-postgres';
import { migrate as runMigrations } from 'drizzle-orm/node-postgres/migrator';
import pg from 'pg';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import * as schema from '../../api/src/db/schema/index.js';
import { DEMO_AS_BUILT } from '../../api/src/domain/as-built/demo-as-built.js';
import type { AsBuilt } from '../../api/src/domain/as-built/as-built.schema.js';
import { IN_PROGRESS_AS_BUILT } from '../../api/src/db/seed/demo-records.js';
import { toRecordRows } from '../../api/src/jobs/as-built-rows.js';
// @ts-expect-error -- plain ESM script shared with `npm start`; no type declarations.
import { ensureDatabase, ensurePostgres } from '../../scripts/lib/setup.mjs';

/*
 * Issue 21's migration (0016): job-scoped items and runs become site records installed by their job on
 * its work date. Loads a database at the migration before it with demo-like data — two jobs on one site
 * (one issued twice, one issued once) and a draft on another site — runs the migration and compares
 * every record before and after: nothing lost or altered, each record on its job's site, installed on
 * its job's work date, runs already abandoned abandoned by their own job; revisions untouched. Later
 * migrations are checked here too where they touch these tables (0018 zones, 0020 change rows).
 */

const TARGET = '0016_add_site_record_lifecycle';
const drizzleFolder = new URL('../../drizzle/', import.meta.url).pathname;
/** Columns that 0016 adds: absent before, checked separately after. */
const NEW_COLUMNS = new Set(['site_id', 'installed_on', 'abandoned_by_job_id', 'abandoned_on', 'removed_by_job_id', 'removed_on']);
/** Columns later migrations add to other tables: absent at 0015, so not written before; compared without. */
const LATER_COLUMNS: Record<string, string[]> = {
  // 0018: zones are dated (checked below).
  zones: ['created_at'],
  // 0019 (issue 17): how a route bend was placed, and its accuracy.
  run_route_points: ['source', 'accuracy_m'],
};
const CHILD_TABLES = ['zones', 'amplifier_channels', 'item_ties', 'run_pairs', 'run_route_points', 'depth_readings', 'commissioning_checks', 'reference_points', 'packet_revisions', 'jobs', 'sites'];

describe('migration 0016: items and runs become site records', () => {
  const database = `loamline_test_site_records_${process.pid}`;
  let url: string;
  let client: pg.Client;
  let before: string;

  beforeAll(async () => {
    url = await ensureDatabase(ensurePostgres(), database, { fresh: true });
    client = new pg.Client({ connectionString: url });
    await client.connect();
    // Every migration before 0016, from a copy of the folder with the journal cut there.
    before = mkdtempSync(join(tmpdir(), 'loamline-migrations-'));
    cpSync(drizzleFolder, before, { recursive: true });
    const journal = JSON.parse(readFileSync(join(before, 'meta/_journal.json'), 'utf8')) as { entries: { tag: string }[] };
    const cut = journal.entries.findIndex((e) => e.tag === TARGET);
    expect(cut).toBeGreaterThan(0);
    writeFileSync(join(before, 'meta/_journal.json'), JSON.stringify({ ...journal, entries: journal.entries.slice(0, cut) }));
    const pool = new pg.Pool({ connectionString: url, max: 1 });
    await runMigrations(drizzle(pool), { migrationsFolder: before });
    await pool.end();
  });

  afterAll(async () => {
    await client?.end();
    if (before) rmSync(before, { recursive: true, force: true });
    const admin = new URL(url);
    admin.pathname = '/postgres';
    const adminClient = new pg.Client({ connectionString: admin.toString() });
    await adminClient.connect();
    await adminClient.query(`drop database if exists "${database}" with (force)`);
    await adminClient.end();
  });

  /** Inserts a row given with the schema's property names, leaving out the columns 0016 adds. */
  async function insert(table: Table, row: Record<string, unknown>): Promise<void> {
    const columns = getTableColumns(table);
    const isRecordTable = table === schema.items || table === schema.runs;
    const tableName = (table as unknown as Record<symbol, string>)[Symbol.for('drizzle:Name')]!;
    const names: string[] = [];
    const values: unknown[] = [];
    for (const [key, value] of Object.entries(row)) {
      const column = columns[key];
      if (!column || (isRecordTable && NEW_COLUMNS.has(column.name)) || LATER_COLUMNS[tableName]?.includes(column.name) || value === undefined) continue;
      names.push(`"${column.name}"`);
      values.push(column.columnType === 'PgJsonb' ? JSON.stringify(value) : value);
    }
    await client.query(`insert into "${tableName}" (${names.join(', ')}) values (${values.map((_, i) => `$${i + 1}`).join(', ')})`, values);
  }

  async function insertRecord(asBuilt: AsBuilt, jobId: string, siteId: string): Promise<void> {
    const ids = new Map<string, string>();
    const rows = toRecordRows(asBuilt, {
      jobId,
      siteId,
      installedOn: 'unused',
      idFor: (id) => ids.get(id) ?? (ids.set(id, randomUUID()), ids.get(id)!),
      newId: randomUUID,
    });
    for (const r of rows.referencePoints) await insert(schema.referencePoints, r);
    for (const r of rows.zones) await insert(schema.zones, r);
    for (const r of rows.items) await insert(schema.items, r);
    for (const r of rows.channels) await insert(schema.amplifierChannels, r);
    for (const r of rows.ties) await insert(schema.itemTies, r);
    for (const r of rows.runs) await insert(schema.runs, r);
    for (const r of rows.pairs) await insert(schema.runPairs, r);
    for (const r of rows.routePoints) await insert(schema.runRoutePoints, r);
    for (const r of rows.depthReadings) await insert(schema.depthReadings, r);
    for (const r of rows.checks) await insert(schema.commissioningChecks, r);
  }

  const dump = async (table: string) =>
    (await client.query(`select to_jsonb(t) as row from "${table}" t order by id`)).rows.map((r: { row: Record<string, unknown> }) => r.row);
  const without = (row: Record<string, unknown>) => Object.fromEntries(Object.entries(row).filter(([k]) => !NEW_COLUMNS.has(k)));

  it('keeps every record, puts it on its job’s site, installed on the job’s work date', async () => {
    const companyId = randomUUID();
    const customerId = randomUUID();
    const [site1, site2] = [randomUUID(), randomUUID()];
    const [jobA, jobB, jobC] = [randomUUID(), randomUUID(), randomUUID()];
    await insert(schema.companies, { id: companyId, name: 'Fernwhistle Test Audio' });
    await insert(schema.customers, { id: customerId, companyId, name: 'Orla Brindlecombe' });
    for (const [id, label] of [
      [site1, 'Brindlecombe back garden'],
      [site2, 'Brindlecombe cottage'],
    ] as const) {
      await insert(schema.sites, { id, companyId, customerId, label, addressLine1: '12 Thistlewick Lane', city: 'Marrowby', country: 'ZZ' });
    }
    // A: issued twice (reopened for revision 2); B: a later job on the same site, start date only; C: a draft without dates.
    await insert(schema.jobs, { id: jobA, companyId, siteId: site1, title: 'Garden speakers', status: 'issued', revision: 2, startDate: '2026-05-11', endDate: '2026-05-14' });
    await insert(schema.jobs, { id: jobB, companyId, siteId: site1, title: 'Fire pit zone', status: 'issued', revision: 1, startDate: '2027-04-02' });
    await insert(schema.jobs, { id: jobC, companyId, siteId: site2, title: 'Cottage porch', status: 'draft', createdAt: new Date('2026-09-30T12:00:00Z') });
    const withAbandoned: AsBuilt = { ...DEMO_AS_BUILT, runs: DEMO_AS_BUILT.runs.map((run, i) => (i === 0 ? { ...run, isAbandoned: true } : run)) };
    await insertRecord(withAbandoned, jobA, site1);
    await insertRecord(IN_PROGRESS_AS_BUILT, jobB, site1);
    await insertRecord(DEMO_AS_BUILT, jobC, site2);
    for (const [jobId, revision] of [
      [jobA, 1],
      [jobA, 2],
      [jobB, 1],
    ] as const) {
      await insert(schema.packetRevisions, {
        companyId,
        jobId,
        revision,
        status: 'ready',
        snapshot: { format: 1, revision, note: 'frozen at issue' },
        paperSize: 'letter',
        pdfKey: `packets/${jobId}/${revision}.pdf`,
        pdfSha256: 'a'.repeat(64),
        zipKey: `packets/${jobId}/${revision}.zip`,
        zipSha256: 'b'.repeat(64),
      });
    }

    const itemsBefore = await dump('items');
    const runsBefore = await dump('runs');
    const childrenBefore: Record<string, unknown[]> = {};
    for (const table of CHILD_TABLES) childrenBefore[table] = await dump(table);
    expect(itemsBefore.length).toBe(2 * DEMO_AS_BUILT.items.length + IN_PROGRESS_AS_BUILT.items.length);
    expect(runsBefore.length).toBe(2 * DEMO_AS_BUILT.runs.length + IN_PROGRESS_AS_BUILT.runs.length);

    const pool = new pg.Pool({ connectionString: url, max: 1 });
    await runMigrations(drizzle(pool), { migrationsFolder: drizzleFolder });
    await pool.end();

    const itemsAfter = await dump('items');
    const runsAfter = await dump('runs');
    // Nothing lost, nothing altered: every column that existed is as it was.
    expect(itemsAfter.map(without)).toEqual(itemsBefore);
    expect(runsAfter.map(without)).toEqual(runsBefore);
    // Later migrations date zones (0018: created_at, from their job, so issued zones stay the site's).
    const zonesAfter = await dump('zones');
    const jobCreated = new Map((await dump('jobs')).map((job) => [job.id, job.created_at]));
    for (const zone of zonesAfter) expect(zone.created_at, 'a zone is dated from its job').toEqual(jobCreated.get(zone.job_id));
    const withoutLater = (table: string, row: Record<string, unknown>) =>
      Object.fromEntries(Object.entries(row).filter(([k]) => !(LATER_COLUMNS[table] ?? []).includes(k)));
    for (const table of CHILD_TABLES) expect((await dump(table)).map((row) => withoutLater(table, row)), table).toEqual(childrenBefore[table]);

    // Each record on its job's site, installed by its job (job_id) on the job's work date:
    // end date, else start date, else the day the job was created.
    const expected: Record<string, { siteId: string; installedOn: string }> = {
      [jobA]: { siteId: site1, installedOn: '2026-05-14' },
      [jobB]: { siteId: site1, installedOn: '2027-04-02' },
      [jobC]: { siteId: site2, installedOn: '2026-09-30' },
    };
    for (const row of [...itemsAfter, ...runsAfter]) {
      const want = expected[row.job_id as string]!;
      expect(row.site_id).toBe(want.siteId);
      expect(row.installed_on).toBe(want.installedOn);
      expect(row.removed_by_job_id).toBeNull();
      expect(row.removed_on).toBeNull();
    }
    for (const row of itemsAfter) expect(row.abandoned_by_job_id).toBeNull();
    for (const row of runsAfter) {
      if (row.is_abandoned) {
        expect(row.abandoned_by_job_id).toBe(row.job_id);
        expect(row.abandoned_on).toBe(expected[row.job_id as string]!.installedOn);
      } else {
        expect(row.abandoned_by_job_id).toBeNull();
        expect(row.abandoned_on).toBeNull();
      }
    }
    expect(runsAfter.filter((r) => r.is_abandoned)).toHaveLength(1);
    // The new columns are required from now on.
    await expect(client.query(`update items set site_id = null where job_id = $1`, [jobC])).rejects.toThrow(/null value/);

    // 0020: a job keeps one change row per record and issue (its issued rows are revisions' history) and
    // at most one unissued row per record, for the change it is making now.
    const recordId = runsAfter[0]!.id as string;
    const change = (issuedAt: string | null) =>
      client.query(
        `insert into site_record_changes (site_id, job_id, record_kind, record_id, change, before, changed_on, issued_at) values ($1, $2, 'run', $3, 'changed', '{}', '2027-04-02', $4)`,
        [site1, jobB, recordId, issuedAt],
      );
    await change('2027-04-03T10:00:00Z');
    await change('2027-06-01T10:00:00Z');
    await change(null);
    await expect(change(null)).rejects.toThrow(/site_record_changes_open_job_id_record_id_key/);
    const held = await client.query(`select count(*)::int as n from site_record_changes where record_id = $1`, [recordId]);
    expect(held.rows[0].n).toBe(3);
  });
});
