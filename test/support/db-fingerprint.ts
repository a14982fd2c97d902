import type pg from 'pg';

/**
 * Tables whose rows the queue workers update in the background (status, attempts, last error): any
 * app started by a test file works the queue of the whole test database, including messages left by
 * earlier files. For these only which rows exist is compared (inserts and deletes), not their columns.
 */
export const QUEUE_WORKED_TABLES = ['packet_revisions', 'packet_deliveries', 'outgoing_mail'] as const;

/** Row count and an md5 of every row (as text, in a fixed order), per table. */
export type DbFingerprint = Record<string, { rows: number; md5: string }>;

/**
 * A cheap whole-database fingerprint for "nothing was written": one SQL statement over every table of
 * the `public` schema (the queue's own `pgboss` schema polls on timers and is left out) giving each
 * table's row count and the md5 of its rows' md5s in order. Two equal fingerprints mean no
 * row was inserted, changed or deleted in between.
 */
export async function fingerprintDatabase(
  client: pg.Client,
  { exclude = [] as string[], idsOnly = QUEUE_WORKED_TABLES as readonly string[] } = {},
): Promise<DbFingerprint> {
  const { rows: tables } = await client.query<{ name: string }>(
    `select table_name as name from information_schema.tables
      where table_schema = 'public' and table_type = 'BASE TABLE' order by table_name`,
  );
  const names = tables.map((t) => t.name).filter((name) => !exclude.includes(name));
  // Guard against building an empty UNION when the schema has no tables.
  if (names.length === 0) return {};
  const sql = names
    .map(
      (name) =>
        idsOnly.includes(name)
          ? `select ${client.escapeLiteral(name)} as name, count(*)::int as rows,
                coalesce(md5(string_agg(t.id::text, E'\\n' order by t.id::text)), '') as md5
           from public.${client.escapeIdentifier(name)} t`
          : // Each row's text is hashed once and the hashes are sorted (not the rows' text, megabytes
            // for a mail attachment): on a worker's database late in a run, 63 ms instead of 120 ms.
            `select ${client.escapeLiteral(name)} as name, count(*)::int as rows,
                coalesce(md5(string_agg(r.h, '' order by r.h)), '') as md5
           from (select md5(t::text) as h from public.${client.escapeIdentifier(name)} t) r`,
    )
    .join(' union all ');
  const { rows } = await client.query<{ name: string; rows: number; md5: string }>(sql);
  return Object.fromEntries(rows.map((r) => [r.name, { rows: r.rows, md5: r.md5 }]));
}

/** The tables whose fingerprint differs (for a readable assertion message). */
export function changedTables(before: DbFingerprint, after: DbFingerprint): string[] {
  const names = new Set([...Object.keys(before), ...Object.keys(after)]);
  return [...names].filter((name) => before[name]?.md5 !== after[name]?.md5 || before[name]?.rows !== after[name]?.rows).sort();
}
