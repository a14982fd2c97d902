import { Inject, Injectable } from '@nestjs/common';
import { and, asc, count, desc, eq, exists, ilike, inArray, isNull, ne, not, notInArray, or, type SQL, sql } from 'drizzle-orm';
import { alias, type AnyPgColumn } from 'drizzle-orm/pg-core';

import { DB, type Db, type Tx } from '../db/db.module.js';
import { afterSortedCursor } from '../db/keyset.js';
import {
  companySettings,
  amplifierChannels,
  commissioningChecks,
  customers,
  depthReadings,
  itemTies,
  items,
  type Job,
  jobs,
  jobTechnicians,
  type NewAmplifierChannelRow,
  type NewCommissioningCheckRow,
  type NewDepthReadingRow,
  type NewItemRow,
  type NewItemTieRow,
  type NewJob,
  type NewRunPairRow,
  type NewRunRoutePointRow,
  type NewRunRow,
  type NewSiteRecordChangeRow,
  packetRevisions,
  referencePoints,
  runPairs,
  siteFeatures,
  runRoutePoints,
  runs,
  type SiteRecordChangeRow,
  siteRecordChanges,
  sites,
  users,
  zones,
} from '../db/schema/index.js';
import type { DepthRuleTable } from '../domain/depth/depth-rules.schema.js';
import type { JobListQuery, JobSortField } from '../domain/jobs/job.schema.js';
import { cursorLimit, cursorPageOffset } from '../domain/paging/page.schema.js';
import type { PacketSnapshot } from '../domain/packet/packet-snapshot.js';
import type { JobRecordRows } from './as-built-rows.js';

/** Escapes LIKE wildcards so a search for "50%" finds the text "50%". */
function likePattern(q: string): string {
  return `%${q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
}

const crewLead = alias(users, 'crew_lead');

/** Whether the job has issued a revision at or after `at`: what it did up to then is part of the site's record. */
function issuedSince(jobIdColumn: AnyPgColumn, at: AnyPgColumn): SQL {
  return sql`exists (select 1 from ${packetRevisions} where ${packetRevisions.jobId} = ${jobIdColumn} and ${packetRevisions.issuedAt} >= ${at})`;
}

/**
 * The records of the site's system as a job sees it: its own records and those other jobs of the site
 * installed before one of their issues, less those removed by this job or by another job that issued
 * since. A record a reopened job added after its last issue, or a removal it has not issued yet, has not
 * happened for anyone else (issue 21: another job's packet must not list it as added or removed).
 */
function systemRecordVisible(table: typeof items | typeof runs, job: Pick<Job, 'id' | 'siteId'>): SQL {
  return and(
    eq(table.siteId, job.siteId),
    or(eq(table.jobId, job.id), issuedSince(table.jobId, table.createdAt)),
    or(isNull(table.removedByJobId), and(ne(table.removedByJobId, job.id), not(issuedSince(table.removedByJobId, table.updatedAt)))),
  )!;
}

const SORT_COLUMNS: Record<JobSortField, SQL | typeof jobs.title> = {
  updatedAt: sql`${jobs.updatedAt}`,
  title: jobs.title,
  status: sql`${jobs.status}`,
  startDate: sql`${jobs.startDate}`,
  site: sql`${sites.label}`,
  customer: sql`${customers.name}`,
};

/** A job with what its summary shows: site, customer and crew lead. */
const jobViewColumns = {
  job: jobs,
  site: { id: sites.id, label: sites.label, city: sites.city },
  customer: { id: customers.id, name: customers.name },
  crewLeadName: crewLead.name,
};

export type JobView = {
  job: Job;
  site: { id: string; label: string; city: string };
  customer: { id: string; name: string };
  crewLeadName: string | null;
};

/** A row of the jobs list: the job's view, its id and its value of the list's sort column as text. */
export type JobListRow = JobView & { id: string; sortKey: string | null };

/** What the as-built read looks up before the record itself (see JobsRepository.findAsBuiltHead). */
export interface AsBuiltHead {
  view: JobView;
  technicians: { id: string; name: string }[];
  siteVersion: number;
  /**
   * The state of the site's other jobs (count, sum of versions, latest write): the job's as-built is
   * the site's system, so a write to any job of the site (an issue, a change to an earlier record)
   * changes it.
   */
  systemState: string;
  depthRules: DepthRuleTable | undefined;
}

/**
 * The job as its summary shows it, its site's version, the state of the site's other jobs, its
 * technicians and the company's depth rule table, in one query (`companyId` and `id` are placeholders).
 */
function asBuiltHeadQuery(db: Db | Tx) {
  return db
    .select({
      ...jobViewColumns,
      siteVersion: sites.version,
      systemState: sql<string>`(select count(*)::text || '.' || coalesce(sum(sj.version), 0)::text || '.' || coalesce(max(extract(epoch from sj.updated_at)), 0)::text
        from ${jobs} sj where sj.site_id = ${jobs.siteId})`,
      technicians: sql<{ id: string; name: string }[]>`coalesce((
        select json_agg(json_build_object('id', ${users.id}, 'name', ${users.name}) order by ${users.name}, ${users.id})
        from ${jobTechnicians} inner join ${users} on ${users.id} = ${jobTechnicians.userId}
        where ${jobTechnicians.jobId} = ${jobs.id}), '[]'::json)`,
      depthRules: sql<DepthRuleTable | null>`(select ${companySettings.depthRules} from ${companySettings} where ${companySettings.companyId} = ${jobs.companyId})`,
    })
    .from(jobs)
    .innerJoin(sites, eq(sites.id, jobs.siteId))
    .innerJoin(customers, eq(customers.id, sites.customerId))
    .leftJoin(crewLead, eq(crewLead.id, jobs.crewLeadUserId))
    .where(and(eq(jobs.companyId, sql.placeholder('companyId')), eq(jobs.id, sql.placeholder('id'))));
}

/**
 * Jobs and their as-built rows. Methods that look a job up take the company id from the signed-in
 * user; child rows are always addressed through their job id (checked by the service first), so nothing
 * here crosses companies.
 */
@Injectable()
export class JobsRepository {
  /** asBuiltHeadQuery as a named prepared statement on the pool (the as-built read's one query on a cache hit). */
  private readonly asBuiltHead: ReturnType<ReturnType<typeof asBuiltHeadQuery>['prepare']>;

  constructor(@Inject(DB) private readonly db: Db) {
    this.asBuiltHead = asBuiltHeadQuery(db).prepare('jobs_as_built_head');
  }

  transaction<T>(work: (tx: Tx) => Promise<T>): Promise<T> {
    return this.db.transaction(work);
  }

  /** A consistent snapshot for reads that span many tables (the as-built). */
  snapshot<T>(work: (tx: Tx) => Promise<T>): Promise<T> {
    return this.db.transaction(work, { isolationLevel: 'repeatable read', accessMode: 'read only' });
  }

  // ---- jobs -------------------------------------------------------------------------------------

  /**
   * One page of the company's jobs matching the query (with one row more than the page, to tell whether
   * another follows), and the total count of matches. Each row carries its id and its value of the sort
   * column as PostgreSQL writes it as text (`sortKey`, null where it has none): a cursor keeps it whole,
   * where a JavaScript Date would drop a timestamp's microseconds and skip or repeat rows.
   */
  async list(companyId: string, userId: string, query: JobListQuery): Promise<{ rows: JobListRow[]; total: number }> {
    const conditions: SQL[] = [eq(jobs.companyId, companyId)];
    if (query.q) {
      const pattern = likePattern(query.q);
      conditions.push(
        or(
          ilike(jobs.title, pattern),
          ilike(sites.label, pattern),
          ilike(sites.addressLine1, pattern),
          ilike(sites.city, pattern),
          ilike(customers.name, pattern),
        )!,
      );
    }
    if (query.status && query.status.length > 0) conditions.push(inArray(jobs.status, query.status));
    if (query.mine) {
      conditions.push(
        or(
          eq(jobs.crewLeadUserId, userId),
          exists(
            this.db
              .select({ one: sql`1` })
              .from(jobTechnicians)
              .where(and(eq(jobTechnicians.jobId, jobs.id), eq(jobTechnicians.userId, userId))),
          ),
        )!,
      );
    }
    const where = and(...conditions);
    const isDescending = query.sort.startsWith('-');
    const column = SORT_COLUMNS[query.sort.replace(/^-/, '') as JobSortField];
    const [rows, [total]] = await Promise.all([
      this.db
        .select({ ...jobViewColumns, id: jobs.id, sortKey: sql<string | null>`${column}::text` })
        .from(jobs)
        .innerJoin(sites, eq(sites.id, jobs.siteId))
        .innerJoin(customers, eq(customers.id, sites.customerId))
        .leftJoin(crewLead, eq(crewLead.id, jobs.crewLeadUserId))
        .where(and(where, afterSortedCursor(column, jobs.id, query.cursor, isDescending)))
        // The id breaks ties so that paging is stable; NULLs (no start date) sit where PostgreSQL puts
        // them by default (last ascending, first descending), which afterSortedCursor follows.
        .orderBy(isDescending ? desc(column) : asc(column), asc(jobs.id))
        .limit(cursorLimit(query))
        .offset(cursorPageOffset(query)),
      this.db
        .select({ n: count() })
        .from(jobs)
        .innerJoin(sites, eq(sites.id, jobs.siteId))
        .innerJoin(customers, eq(customers.id, sites.customerId))
        .where(where),
    ]);
    return { rows, total: total?.n ?? 0 };
  }

  async findView(companyId: string, id: string, tx?: Tx): Promise<JobView | undefined> {
    const [row] = await (tx ?? this.db)
      .select(jobViewColumns)
      .from(jobs)
      .innerJoin(sites, eq(sites.id, jobs.siteId))
      .innerJoin(customers, eq(customers.id, sites.customerId))
      .leftJoin(crewLead, eq(crewLead.id, jobs.crewLeadUserId))
      .where(and(eq(jobs.companyId, companyId), eq(jobs.id, id)));
    return row;
  }

  /**
   * In ONE query: the job's view, its technicians (by name), its site's version and the company's own
   * depth rule table — everything the as-built read needs to find its analysis in the cache (the key is
   * job version + site version + rule table) and to answer the job part fresh.
   */
  async findAsBuiltHead(companyId: string, id: string, tx?: Tx): Promise<AsBuiltHead | undefined> {
    // Outside a transaction (every cached read) the query runs as a named prepared statement: neither
    // built again by Drizzle nor parsed again by PostgreSQL on that connection.
    const [row] = await (tx ? asBuiltHeadQuery(tx) : this.asBuiltHead).execute({ companyId, id });
    if (!row) return undefined;
    const { siteVersion, systemState, technicians, depthRules, ...view } = row;
    return { view, siteVersion, systemState, technicians, depthRules: depthRules ?? undefined };
  }

  /** Reads the job and locks its row until the transaction ends: writes to one job run one at a time. */
  async lock(companyId: string, id: string, tx: Tx): Promise<Job | undefined> {
    const [row] = await tx
      .select()
      .from(jobs)
      .where(and(eq(jobs.companyId, companyId), eq(jobs.id, id)))
      .for('update');
    return row;
  }

  /** The company's own depth rule table, or undefined when it follows the shipped defaults. */
  async companyDepthRules(companyId: string, tx?: Tx): Promise<DepthRuleTable | undefined> {
    const [row] = await (tx ?? this.db).select({ depthRules: companySettings.depthRules }).from(companySettings).where(eq(companySettings.companyId, companyId));
    return row?.depthRules ?? undefined;
  }

  /** The company's BCP 47 locale (its profile; en-US until the admin chooses another). */
  async companyLocale(companyId: string): Promise<string> {
    const [row] = await this.db.select({ locale: companySettings.locale }).from(companySettings).where(eq(companySettings.companyId, companyId));
    return row?.locale ?? 'en-US';
  }

  async technicians(jobId: string, tx?: Tx): Promise<{ id: string; name: string }[]> {
    return (tx ?? this.db)
      .select({ id: users.id, name: users.name })
      .from(jobTechnicians)
      .innerJoin(users, eq(users.id, jobTechnicians.userId))
      .where(eq(jobTechnicians.jobId, jobId))
      .orderBy(asc(users.name));
  }

  async insert(job: NewJob, tx: Tx): Promise<Job> {
    const [row] = await tx.insert(jobs).values(job).returning();
    return row!;
  }

  async update(id: string, patch: Partial<NewJob>, tx: Tx): Promise<void> {
    await tx.update(jobs).set(patch).where(eq(jobs.id, id));
  }

  /** Bumps the optimistic-lock version (the row is locked by `lock`) and returns the new one. */
  async bumpVersion(id: string, tx: Tx): Promise<number> {
    const [row] = await tx
      .update(jobs)
      .set({ version: sql`${jobs.version} + 1`, updatedAt: new Date() })
      .where(eq(jobs.id, id))
      .returning({ version: jobs.version });
    return row!.version;
  }

  async delete(id: string, tx: Tx): Promise<void> {
    await tx.delete(jobs).where(eq(jobs.id, id));
  }

  async replaceTechnicians(jobId: string, userIds: readonly string[], tx: Tx): Promise<void> {
    await tx.delete(jobTechnicians).where(eq(jobTechnicians.jobId, jobId));
    // Guard against inserting an empty VALUES list.
    if (userIds.length === 0) return;
    await tx.insert(jobTechnicians).values(userIds.map((userId) => ({ jobId, userId })));
  }

  /** Staff users of the company among `ids`, with their roles (for crew assignments). */
  async findUsers(companyId: string, ids: readonly string[], tx?: Tx) {
    // Guard against an empty IN () list, which is a syntax error.
    if (ids.length === 0) return [];
    return (tx ?? this.db)
      .select({ id: users.id, role: users.role, isDisabled: users.isDisabled })
      .from(users)
      .where(and(eq(users.companyId, companyId), inArray(users.id, [...ids])));
  }

  async siteInCompany(companyId: string, siteId: string, tx?: Tx): Promise<boolean> {
    const [row] = await (tx ?? this.db)
      .select({ id: sites.id })
      .from(sites)
      .where(and(eq(sites.companyId, companyId), eq(sites.id, siteId)));
    return row !== undefined;
  }

  // ---- the as-built -----------------------------------------------------------------------------

  /**
   * Every row of one job's as-built, in a fixed number of queries (one per table) however large the job
   * is. Run it inside `snapshot` (or the write's transaction) for a consistent view.
   */
  async loadRecord(job: Pick<Job, 'id' | 'siteId'>, tx: Tx): Promise<JobRecordRows> {
    const [site] = await tx
      .select({ northAzimuthDeg: sites.northAzimuthDeg, originLat: sites.originLat, originLon: sites.originLon })
      .from(sites)
      .where(eq(sites.id, job.siteId));
    const itemVisible = systemRecordVisible(items, job);
    const runVisible = systemRecordVisible(runs, job);
    const zoneRows = await tx
      .select({ zone: zones })
      .from(zones)
      .innerJoin(jobs, eq(jobs.id, zones.jobId))
      .where(and(eq(jobs.siteId, job.siteId), or(eq(zones.jobId, job.id), issuedSince(zones.jobId, zones.createdAt))))
      .orderBy(asc(zones.seq));
    const pointRows = await tx
      .select()
      .from(referencePoints)
      .where(eq(referencePoints.siteId, job.siteId))
      .orderBy(asc(referencePoints.seq));
    const featureRows = await tx.select().from(siteFeatures).where(eq(siteFeatures.siteId, job.siteId)).orderBy(asc(siteFeatures.seq));
    const itemRows = await tx.select().from(items).where(itemVisible).orderBy(asc(items.seq));
    const channelRows = await tx
      .select({ channel: amplifierChannels })
      .from(amplifierChannels)
      .innerJoin(items, eq(items.id, amplifierChannels.itemId))
      .where(itemVisible)
      .orderBy(asc(amplifierChannels.seq));
    const tieRows = await tx
      .select({ tie: itemTies })
      .from(itemTies)
      .innerJoin(items, eq(items.id, itemTies.itemId))
      .where(itemVisible)
      .orderBy(asc(itemTies.itemId), asc(itemTies.ordinal));
    const runRows = await tx.select().from(runs).where(runVisible).orderBy(asc(runs.seq));
    const pairRows = await tx
      .select({ pair: runPairs })
      .from(runPairs)
      .innerJoin(runs, eq(runs.id, runPairs.runId))
      .where(runVisible);
    const routeRows = await tx
      .select({ point: runRoutePoints })
      .from(runRoutePoints)
      .innerJoin(runs, eq(runs.id, runRoutePoints.runId))
      .where(runVisible)
      .orderBy(asc(runRoutePoints.runId), asc(runRoutePoints.ordinal));
    const readingRows = await tx
      .select({ reading: depthReadings })
      .from(depthReadings)
      .innerJoin(runs, eq(runs.id, depthReadings.runId))
      .where(runVisible)
      .orderBy(asc(depthReadings.runId), asc(depthReadings.stationM), asc(depthReadings.seq));
    const checkRows = await tx
      .select()
      .from(commissioningChecks)
      .where(eq(commissioningChecks.jobId, job.id))
      .orderBy(asc(commissioningChecks.seq));
    const siteJobs = await tx.select({ id: jobs.id, title: jobs.title }).from(jobs).where(eq(jobs.siteId, job.siteId));
    const [lastIssue] = await tx
      .select({ at: sql<Date | null>`max(${packetRevisions.issuedAt})`.mapWith(packetRevisions.issuedAt) })
      .from(packetRevisions)
      .where(eq(packetRevisions.jobId, job.id));
    const changeRows = await tx.select().from(siteRecordChanges).where(eq(siteRecordChanges.siteId, job.siteId)).orderBy(asc(siteRecordChanges.createdAt));
    const removedItems = await tx
      .select({ id: items.id, label: items.label, removedOn: items.removedOn })
      .from(items)
      .where(eq(items.removedByJobId, job.id));
    const removedRuns = await tx
      .select({ id: runs.id, label: runs.label, removedOn: runs.removedOn })
      .from(runs)
      .where(eq(runs.removedByJobId, job.id));
    return {
      site: site!,
      zones: zoneRows.map((r) => r.zone),
      referencePoints: pointRows,
      features: featureRows,
      items: itemRows,
      channels: channelRows.map((r) => r.channel),
      ties: tieRows.map((r) => r.tie),
      runs: runRows,
      pairs: pairRows.map((r) => r.pair),
      routePoints: routeRows.map((r) => r.point),
      depthReadings: readingRows.map((r) => r.reading),
      checks: checkRows,
      system: {
        jobId: job.id,
        jobTitles: Object.fromEntries(siteJobs.map((j) => [j.id, j.title])),
        changes: changeRows,
        removedByThisJob: [
          ...removedItems.map((r) => ({ kind: 'item' as const, id: r.id, label: r.label, removedOn: r.removedOn! })),
          ...removedRuns.map((r) => ({ kind: 'run' as const, id: r.id, label: r.label, removedOn: r.removedOn! })),
        ],
        lastIssuedAt: lastIssue?.at ?? null,
      },
    };
  }

  // ---- the site's system: changes to earlier jobs' records ---------------------------------------

  /**
   * Locks an item or run row of the site until the transaction ends and returns who installed it, its
   * label, and whether its installing job has issued it (a packet revision at or after it was added).
   */
  async lockSystemRecord(
    kind: 'item' | 'run',
    id: string,
    siteId: string,
    tx: Tx,
  ): Promise<{ jobId: string; label: string; isIssued: boolean } | undefined> {
    const table = kind === 'item' ? items : runs;
    const [row] = await tx
      .select({ jobId: table.jobId, label: table.label, isIssued: sql<boolean>`${issuedSince(table.jobId, table.createdAt)}` })
      .from(table)
      .where(and(eq(table.id, id), eq(table.siteId, siteId)))
      .for('update');
    return row;
  }

  /** Another job's change to the record that is not issued yet (it holds the record), with that job's title. */
  async openChangeByOtherJob(recordId: string, jobId: string, tx: Tx): Promise<{ jobId: string; title: string } | undefined> {
    const [row] = await tx
      .select({ jobId: siteRecordChanges.jobId, title: jobs.title })
      .from(siteRecordChanges)
      .innerJoin(jobs, eq(jobs.id, siteRecordChanges.jobId))
      .where(and(eq(siteRecordChanges.recordId, recordId), ne(siteRecordChanges.jobId, jobId), isNull(siteRecordChanges.issuedAt)))
      .limit(1);
    return row;
  }

  /**
   * The job's change to a record since its last issue (the open cycle's row), if it made one. Issued
   * rows are the history earlier revisions rely on: never returned here, so never undone or rewritten.
   */
  async findOpenChange(jobId: string, recordId: string, tx: Tx): Promise<SiteRecordChangeRow | undefined> {
    const [row] = await tx
      .select()
      .from(siteRecordChanges)
      .where(and(eq(siteRecordChanges.jobId, jobId), eq(siteRecordChanges.recordId, recordId), isNull(siteRecordChanges.issuedAt)));
    return row;
  }

  /**
   * Records (or updates) the job's change to an earlier record in its open cycle. `before` is kept from
   * the cycle's first change. An issued row of the same job and record is left as issued: a reopened
   * job's change is a new row whose `before` (given by the caller) is the record as that issue left it.
   */
  async upsertChange(change: Omit<NewSiteRecordChangeRow, 'id' | 'issuedAt'>, tx: Tx): Promise<void> {
    await tx
      .insert(siteRecordChanges)
      .values(change)
      .onConflictDoUpdate({
        // The partial unique index site_record_changes_open_job_id_record_id_key (issued_at is null).
        target: [siteRecordChanges.jobId, siteRecordChanges.recordId],
        targetWhere: sql`${siteRecordChanges.issuedAt} is null`,
        set: { change: change.change, changedOn: change.changedOn, updatedAt: new Date() },
      });
  }

  /** Deletes the job's unissued change to the record (an undo); its issued changes stay. */
  async deleteOpenChange(jobId: string, recordId: string, tx: Tx): Promise<void> {
    await tx
      .delete(siteRecordChanges)
      .where(and(eq(siteRecordChanges.jobId, jobId), eq(siteRecordChanges.recordId, recordId), isNull(siteRecordChanges.issuedAt)));
  }

  /** Sets (or clears, with null) the abandoned-by columns of a record. */
  async setAbandoned(kind: 'item' | 'run', id: string, by: { jobId: string; on: string } | null, tx: Tx): Promise<void> {
    const table = kind === 'item' ? items : runs;
    await tx
      .update(table)
      .set({ abandonedByJobId: by?.jobId ?? null, abandonedOn: by?.on ?? null, updatedAt: new Date() })
      .where(eq(table.id, id));
  }

  /** Marks a record removed by the job on its work date (or puts it back, with null). */
  async setRemoved(kind: 'item' | 'run', id: string, by: { jobId: string; on: string } | null, tx: Tx): Promise<void> {
    const table = kind === 'item' ? items : runs;
    await tx
      .update(table)
      .set({ removedByJobId: by?.jobId ?? null, removedOn: by?.on ?? null, updatedAt: new Date() })
      .where(eq(table.id, id));
  }

  /** Runs of other jobs that start or end at the item (they keep it in use). */
  async runsOfOtherJobsAt(itemId: string, jobId: string, tx: Tx): Promise<{ id: string; label: string }[]> {
    return tx
      .select({ id: runs.id, label: runs.label })
      .from(runs)
      .where(and(ne(runs.jobId, jobId), or(eq(runs.fromItemId, itemId), eq(runs.toItemId, itemId))));
  }

  /**
   * At issue: what the job did since its previous issue (records it added, runs it abandoned or removed)
   * takes its work date; what an earlier revision already dated keeps its date. Its open changes to
   * records of the site become issued (they no longer hold those records) and are never changed again.
   */
  async markIssued(jobId: string, workDate: string, tx: Tx): Promise<void> {
    const lastIssue = sql`(select max(${packetRevisions.issuedAt}) from ${packetRevisions} where ${packetRevisions.jobId} = ${jobId})`;
    const since = (column: AnyPgColumn) => sql`(${lastIssue} is null or ${column} > ${lastIssue})`;
    await tx.update(items).set({ installedOn: workDate }).where(and(eq(items.jobId, jobId), since(items.createdAt)));
    await tx.update(runs).set({ installedOn: workDate }).where(and(eq(runs.jobId, jobId), since(runs.createdAt)));
    // Abandoned since the last issue: a record of its own added since, or one its open change abandons.
    // One an earlier revision abandoned keeps that revision's date, though this revision changed it since.
    const abandonedNow = (table: typeof items | typeof runs) =>
      or(
        since(table.createdAt),
        sql`exists (select 1 from ${siteRecordChanges} where ${siteRecordChanges.jobId} = ${jobId} and ${siteRecordChanges.recordId} = ${table.id} and ${siteRecordChanges.issuedAt} is null and ${siteRecordChanges.change} = 'abandoned')`,
      );
    await tx.update(items).set({ abandonedOn: workDate }).where(and(eq(items.abandonedByJobId, jobId), abandonedNow(items)));
    await tx.update(runs).set({ abandonedOn: workDate }).where(and(eq(runs.abandonedByJobId, jobId), abandonedNow(runs)));
    await tx.update(items).set({ removedOn: workDate }).where(and(eq(items.removedByJobId, jobId), since(items.updatedAt)));
    await tx.update(runs).set({ removedOn: workDate }).where(and(eq(runs.removedByJobId, jobId), since(runs.updatedAt)));
    await tx
      .update(siteRecordChanges)
      .set({ changedOn: workDate, issuedAt: sql`now()` })
      .where(and(eq(siteRecordChanges.jobId, jobId), isNull(siteRecordChanges.issuedAt)));
  }

  /**
   * The site's newest issued packet revision (of any job), with its frozen as-built: the packet a new
   * issue supersedes. Undefined for the site's first packet.
   */
  async latestSitePacket(siteId: string, tx: Tx) {
    const [row] = await tx
      .select({
        revisionId: packetRevisions.id,
        jobId: packetRevisions.jobId,
        jobTitle: jobs.title,
        revision: packetRevisions.revision,
        issuedAt: packetRevisions.issuedAt,
        asBuilt: sql<PacketSnapshot['asBuilt'] | null>`${packetRevisions.snapshot} -> 'asBuilt'`,
      })
      .from(packetRevisions)
      .innerJoin(jobs, eq(jobs.id, packetRevisions.jobId))
      .where(eq(jobs.siteId, siteId))
      .orderBy(desc(packetRevisions.issuedAt), desc(packetRevisions.revision))
      .limit(1);
    return row;
  }

  /**
   * Each job's newest packet revision of the site issued at or before `at` (the superseded packet and
   * what stood beside it), with its frozen as-built and whether it froze the whole site system (a
   * snapshot with site records) or, issued before the site record, only its own job's records.
   */
  async sitePacketsUpTo(siteId: string, at: Date, tx: Tx) {
    return tx
      .selectDistinctOn([packetRevisions.jobId], {
        issuedAt: packetRevisions.issuedAt,
        asBuilt: sql<PacketSnapshot['asBuilt'] | null>`${packetRevisions.snapshot} -> 'asBuilt'`,
        isSiteWide: sql<boolean>`${packetRevisions.snapshot} ? 'siteRecords'`,
        channelSetups: sql<PacketSnapshot['channelSetups'] | null>`${packetRevisions.snapshot} -> 'channelSetups'`,
      })
      .from(packetRevisions)
      .innerJoin(jobs, eq(jobs.id, packetRevisions.jobId))
      .where(and(eq(jobs.siteId, siteId), sql`${packetRevisions.issuedAt} <= ${at}`))
      .orderBy(packetRevisions.jobId, desc(packetRevisions.issuedAt), desc(packetRevisions.revision));
  }

  /** Whether the job changed records of earlier jobs (such a job cannot simply be deleted). */
  async changedEarlierRecords(jobId: string, tx: Tx): Promise<number> {
    const [row] = await tx.select({ n: count() }).from(siteRecordChanges).where(eq(siteRecordChanges.jobId, jobId));
    return row?.n ?? 0;
  }

  // ---- zones ------------------------------------------------------------------------------------

  async insertZone(jobId: string, id: string, name: string, tx: Tx) {
    const [row] = await tx.insert(zones).values({ id, jobId, name }).returning();
    return row!;
  }

  async updateZone(jobId: string, id: string, name: string, tx: Tx) {
    const [row] = await tx
      .update(zones)
      .set({ name })
      .where(and(eq(zones.jobId, jobId), eq(zones.id, id)))
      .returning();
    return row;
  }

  /** Deletes the zone; its items stay, without a zone (ON DELETE SET NULL). */
  async deleteZone(jobId: string, id: string, tx: Tx): Promise<boolean> {
    const rows = await tx
      .delete(zones)
      .where(and(eq(zones.jobId, jobId), eq(zones.id, id)))
      .returning({ id: zones.id });
    return rows.length > 0;
  }

  // ---- items ------------------------------------------------------------------------------------

  async insertItem(
    item: Omit<NewItemRow, 'seq'>,
    channels: Omit<NewAmplifierChannelRow, 'seq'>[],
    ties: NewItemTieRow[],
    tx: Tx,
  ): Promise<void> {
    await tx.insert(items).values(item);
    if (channels.length > 0) await tx.insert(amplifierChannels).values(channels);
    if (ties.length > 0) await tx.insert(itemTies).values(ties);
  }

  /**
   * Replaces an item's fields and ties. Channels listed in `channels` are updated when they exist and
   * inserted when new; the item's other channels are deleted (which fails if a run or check uses them).
   */
  async replaceItem(
    jobId: string,
    item: Omit<NewItemRow, 'seq'> & { id: string },
    channels: { row: Omit<NewAmplifierChannelRow, 'seq'> & { id: string }; isNew: boolean }[],
    ties: NewItemTieRow[],
    tx: Tx,
  ): Promise<void> {
    // The record may be an earlier job's (a change by this job): who installed it, where and when stays.
    const { jobId: _installedBy, siteId: _siteId, installedOn: _installedOn, ...fields } = item;
    void jobId;
    await tx
      .update(items)
      .set({ ...fields, updatedAt: new Date() })
      .where(eq(items.id, item.id));
    const keptIds = channels.filter((c) => !c.isNew).map((c) => c.row.id);
    await tx
      .delete(amplifierChannels)
      .where(
        keptIds.length > 0
          ? and(eq(amplifierChannels.itemId, item.id), notInArray(amplifierChannels.id, keptIds))
          : eq(amplifierChannels.itemId, item.id),
      );
    for (const channel of channels.filter((c) => !c.isNew)) {
      await tx
        .update(amplifierChannels)
        .set({ name: channel.row.name, cvLineVoltage: channel.row.cvLineVoltage, cvRatedWatts: channel.row.cvRatedWatts })
        .where(eq(amplifierChannels.id, channel.row.id));
    }
    const added = channels.filter((c) => c.isNew).map((c) => c.row);
    if (added.length > 0) await tx.insert(amplifierChannels).values(added);
    await tx.delete(itemTies).where(eq(itemTies.itemId, item.id));
    if (ties.length > 0) await tx.insert(itemTies).values(ties);
  }

  async deleteItem(jobId: string, id: string, tx: Tx): Promise<void> {
    await tx.delete(items).where(and(eq(items.jobId, jobId), eq(items.id, id)));
  }

  async updateChannelSetup(itemId: string, channelId: string, setup: Partial<NewAmplifierChannelRow>, tx: Tx) {
    const [row] = await tx
      .update(amplifierChannels)
      .set(setup)
      .where(and(eq(amplifierChannels.itemId, itemId), eq(amplifierChannels.id, channelId)))
      .returning();
    return row;
  }

  // ---- runs -------------------------------------------------------------------------------------

  async insertRun(
    run: Omit<NewRunRow, 'seq'>,
    pairs: NewRunPairRow[],
    route: NewRunRoutePointRow[],
    readings: Omit<NewDepthReadingRow, 'seq'>[],
    tx: Tx,
  ): Promise<void> {
    await tx.insert(runs).values(run);
    if (pairs.length > 0) await tx.insert(runPairs).values(pairs);
    if (route.length > 0) await tx.insert(runRoutePoints).values(route);
    if (readings.length > 0) await tx.insert(depthReadings).values(readings);
  }

  /** Replaces a run's fields, pairs and route; its readings too when `readings` is given. */
  async replaceRun(
    jobId: string,
    run: Omit<NewRunRow, 'seq'> & { id: string },
    pairs: NewRunPairRow[],
    route: NewRunRoutePointRow[],
    readings: Omit<NewDepthReadingRow, 'seq'>[] | undefined,
    tx: Tx,
  ): Promise<void> {
    // The record may be an earlier job's (a change by this job): who installed it, where and when stays.
    const { jobId: _installedBy, siteId: _siteId, installedOn: _installedOn, ...fields } = run;
    void jobId;
    await tx
      .update(runs)
      .set({ ...fields, updatedAt: new Date() })
      .where(eq(runs.id, run.id));
    await tx.delete(runPairs).where(eq(runPairs.runId, run.id));
    if (pairs.length > 0) await tx.insert(runPairs).values(pairs);
    await tx.delete(runRoutePoints).where(eq(runRoutePoints.runId, run.id));
    if (route.length > 0) await tx.insert(runRoutePoints).values(route);
    if (readings !== undefined) {
      await tx.delete(depthReadings).where(eq(depthReadings.runId, run.id));
      if (readings.length > 0) await tx.insert(depthReadings).values(readings);
    }
  }

  async deleteRun(jobId: string, id: string, tx: Tx): Promise<void> {
    await tx.delete(runs).where(and(eq(runs.jobId, jobId), eq(runs.id, id)));
  }

  // ---- depth readings ---------------------------------------------------------------------------

  async insertReading(reading: Omit<NewDepthReadingRow, 'seq'>, tx: Tx) {
    const [row] = await tx.insert(depthReadings).values(reading).returning();
    return row!;
  }

  async updateReading(runId: string, id: string, patch: { stationM?: number; depthM?: number }, tx: Tx) {
    const [row] = await tx
      .update(depthReadings)
      .set(patch)
      .where(and(eq(depthReadings.runId, runId), eq(depthReadings.id, id)))
      .returning();
    return row;
  }

  async deleteReading(runId: string, id: string, tx: Tx): Promise<void> {
    await tx.delete(depthReadings).where(and(eq(depthReadings.runId, runId), eq(depthReadings.id, id)));
  }

  // ---- commissioning checks ---------------------------------------------------------------------

  async insertCheck(check: Omit<NewCommissioningCheckRow, 'seq'>, tx: Tx): Promise<void> {
    await tx.insert(commissioningChecks).values(check);
  }

  async replaceCheck(jobId: string, check: Omit<NewCommissioningCheckRow, 'seq'> & { id: string }, tx: Tx): Promise<void> {
    // The original recorder and time stay: a correction is not a new measurement.
    const { recordedByUserId: _recordedBy, ...fields } = check;
    await tx
      .update(commissioningChecks)
      .set(fields)
      .where(and(eq(commissioningChecks.jobId, jobId), eq(commissioningChecks.id, check.id)));
  }

  async deleteCheck(jobId: string, id: string, tx: Tx): Promise<void> {
    await tx.delete(commissioningChecks).where(and(eq(commissioningChecks.jobId, jobId), eq(commissioningChecks.id, id)));
  }
}

