import { Inject, Injectable } from '@nestjs/common';
import { and, asc, desc, eq, inArray } from 'drizzle-orm';

import { DB, type Db } from '../db/db.module.js';
import { companies, companySettings, jobs, packetRevisions, siteHomeowners, sites } from '../db/schema/index.js';

/** What a homeowner may read: only sites linked to them (site_homeowners) and their ready revisions. */
@Injectable()
export class PortalRepository {
  constructor(@Inject(DB) private readonly db: Db) {}

  private sitesQuery(userId: string) {
    return this.db
      .select({
        site: sites,
        companyName: companies.name,
        phone: companySettings.contactPhone,
        email: companySettings.contactEmail,
        licenceNumbers: companySettings.licenceNumbers,
      })
      .from(sites)
      .innerJoin(siteHomeowners, and(eq(siteHomeowners.siteId, sites.id), eq(siteHomeowners.userId, userId)))
      .innerJoin(companies, eq(companies.id, sites.companyId))
      .leftJoin(companySettings, eq(companySettings.companyId, sites.companyId));
  }

  sitesOf(userId: string) {
    return this.sitesQuery(userId).orderBy(asc(sites.label), asc(sites.id));
  }

  async siteOf(userId: string, siteId: string) {
    const [row] = await this.sitesQuery(userId).where(eq(sites.id, siteId));
    return row;
  }

  /** Ready revisions of every job at these sites, newest first. */
  readyRevisions(siteIds: readonly string[]) {
    // Guard against an invalid `IN ()` for a homeowner without sites.
    if (siteIds.length === 0) return Promise.resolve([]);
    return this.db
      .select({
        id: packetRevisions.id,
        siteId: jobs.siteId,
        jobId: packetRevisions.jobId,
        jobTitle: jobs.title,
        revision: packetRevisions.revision,
        issuedAt: packetRevisions.issuedAt,
        pageCount: packetRevisions.pageCount,
        pdfBytes: packetRevisions.pdfBytes,
        pdfSha256: packetRevisions.pdfSha256,
        zipBytes: packetRevisions.zipBytes,
        zipSha256: packetRevisions.zipSha256,
      })
      .from(packetRevisions)
      .innerJoin(jobs, eq(jobs.id, packetRevisions.jobId))
      .where(and(eq(packetRevisions.status, 'ready'), inArray(jobs.siteId, [...siteIds])))
      .orderBy(desc(packetRevisions.issuedAt), desc(packetRevisions.revision));
  }

  /** The revision's company, when its job's site is linked to the homeowner. */
  async revisionOf(userId: string, revisionId: string) {
    const [row] = await this.db
      .select({ companyId: packetRevisions.companyId })
      .from(packetRevisions)
      .innerJoin(jobs, eq(jobs.id, packetRevisions.jobId))
      .innerJoin(siteHomeowners, and(eq(siteHomeowners.siteId, jobs.siteId), eq(siteHomeowners.userId, userId)))
      .where(eq(packetRevisions.id, revisionId));
    return row;
  }
}
