import { Inject, Injectable } from '@nestjs/common';
import { and, asc, eq, inArray, sql } from 'drizzle-orm';

import { DB, type Db, type Tx } from '../db/db.module.js';
import { jobs, jobTechnicians, type Site, sites } from '../db/schema/index.js';
import type { SiteJobFacts } from '../domain/sites/site-rules.js';

/** The rows `SiteWriter` locks and bumps: the site, and the jobs placed on it. */
@Injectable()
export class SiteVersionsRepository {
  constructor(@Inject(DB) private readonly db: Db) {}

  transaction<T>(work: (tx: Tx) => Promise<T>): Promise<T> {
    return this.db.transaction(work);
  }

  /** The site of the company, read without a lock (a cheap pre-check before costly work). */
  async find(companyId: string, siteId: string, tx?: Tx): Promise<Site | undefined> {
    const [row] = await (tx ?? this.db)
      .select()
      .from(sites)
      .where(and(eq(sites.companyId, companyId), eq(sites.id, siteId)));
    return row;
  }

  /** Reads the site and locks its row until the transaction ends: writes to one site run one at a time. */
  async lock(companyId: string, siteId: string, tx: Tx): Promise<Site | undefined> {
    const [row] = await tx
      .select()
      .from(sites)
      .where(and(eq(sites.companyId, companyId), eq(sites.id, siteId)))
      .for('update');
    return row;
  }

  /**
   * The site's jobs with their crews. With `tx` and `isLocking`, the job rows are locked (in id order)
   * so no job changes status, or is written, while the site's geometry changes under it.
   */
  async jobs(siteId: string, tx?: Tx, isLocking = false): Promise<SiteJobFacts[]> {
    const base = (tx ?? this.db)
      .select({ id: jobs.id, title: jobs.title, status: jobs.status, crewLeadUserId: jobs.crewLeadUserId })
      .from(jobs)
      .where(eq(jobs.siteId, siteId))
      .orderBy(asc(jobs.id));
    const rows = isLocking ? await base.for('update') : await base;
    if (rows.length === 0) return [];
    const crew = await (tx ?? this.db)
      .select({ jobId: jobTechnicians.jobId, userId: jobTechnicians.userId })
      .from(jobTechnicians)
      .where(
        inArray(
          jobTechnicians.jobId,
          rows.map((r) => r.id),
        ),
      );
    return rows.map((r) => ({ ...r, crewUserIds: crew.filter((c) => c.jobId === r.id).map((c) => c.userId) }));
  }

  /** Bumps the site's version (the row is locked by `lock`) and returns the new one. */
  async bumpSite(siteId: string, tx: Tx): Promise<number> {
    const [row] = await tx
      .update(sites)
      .set({ version: sql`${sites.version} + 1`, updatedAt: new Date() })
      .where(eq(sites.id, siteId))
      .returning({ version: sites.version });
    return row!.version;
  }

  /** Bumps the version of each job (rows locked by `jobs(…, true)`); job id → new version. */
  async bumpJobs(jobIds: readonly string[], tx: Tx): Promise<Record<string, number>> {
    if (jobIds.length === 0) return {};
    const rows = await tx
      .update(jobs)
      .set({ version: sql`${jobs.version} + 1`, updatedAt: new Date() })
      .where(inArray(jobs.id, [...jobIds]))
      .returning({ id: jobs.id, version: jobs.version });
    return Object.fromEntries(rows.map((r) => [r.id, r.version]));
  }
}
