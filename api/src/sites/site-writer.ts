import { Injectable } from '@nestjs/common';

import { findOrFail } from '../domain/errors.js';
import { AuditService } from '../audit/audit.service.js';
import type { AuthUser } from '../common/decorators/current-user.decorator.js';
import type { Tx } from '../db/db.module.js';
import type { Site } from '../db/schema/index.js';
import {
  canWriteSite,
  SITE_OPEN_JOB_STATUSES,
  type SiteJobFacts,
  type SiteVersionResponse,
  type SiteWriteKind,
} from '../domain/sites/site-rules.js';
import { siteDenied, siteNotFound, siteVersionConflict } from './site-errors.js';
import { SiteVersionsRepository } from './site-versions.repository.js';

export interface SiteWriteContext {
  tx: Tx;
  /** The site row as locked, before the write. */
  site: Site;
  /** Its jobs with their crews (locked too for a geometry write). */
  jobs: readonly SiteJobFacts[];
}

/**
 * What the work of a write gives back: its `result`, or `readAfter`, called once the versions are
 * bumped (in the same transaction) for a result that shows the site's new version (e.g. the whole site).
 */
export type SiteWorkOutcome<T> = { audit: SiteAuditTarget } & ({ result: T } | { readAfter: () => Promise<T> });

export interface SiteAuditTarget {
  action: string;
  targetType: string;
  targetId: string;
  details?: Record<string, unknown>;
}

/**
 * Runs one write to a site or what belongs to it (reference points, plan image, shapes on the plan) in
 * a transaction, as `JobWriter` does for jobs: locks the site row (404 outside the actor's company), for
 * a geometry write also locks its jobs' rows, checks the actor's rights and the jobs' statuses
 * (`canWriteSite`: 403, or 409 `SITE_JOBS_IN_REVIEW` naming the jobs), and the version the client last
 * saw (412 `VERSION_CONFLICT` with `currentVersion`); then does the work, bumps `sites.version` — and,
 * for geometry, the version of every open job on the site, so an office review or a crew edit made
 * against the old geometry fails with the usual conflict — and writes the audit entry. Anything thrown
 * rolls the whole transaction back, so a refused write writes nothing.
 *
 * Usage (inside the sites module, or any module importing it):
 * ```ts
 * return this.siteWriter.write(actor, siteId, expectedVersion, 'geometry', async ({ tx, site }) => {
 *   const row = await this.repository.insertThing(site.id, input, tx);
 *   return { result: toThing(row), audit: { action: 'site.thing.create', targetType: 'thing', targetId: row.id } };
 * });
 * ```
 * The controller takes the version with `@ExpectedVersion('site')` (If-Match or `expectedVersion`).
 */
@Injectable()
export class SiteWriter {
  constructor(
    private readonly repository: SiteVersionsRepository,
    private readonly audit: AuditService,
  ) {}

  /**
   * The same checks without a lock or a write: for a route that does costly work (an image upload)
   * before its transaction, so a stale or refused request fails fast. `write` checks again.
   */
  async precheck(actor: AuthUser, siteId: string, expectedVersion: number, kind: SiteWriteKind): Promise<void> {
    const site = await findOrFail(this.repository.find(actor.companyId, siteId), siteNotFound);
    const decision = canWriteSite({ role: actor.role, userId: actor.id }, await this.repository.jobs(siteId), kind);
    if (!decision.isAllowed) throw siteDenied(decision);
    if (site.version !== expectedVersion) throw siteVersionConflict(site.version);
  }

  /** Locks the site (and, for geometry, its jobs) and checks rights, statuses and the expected version. */
  async lockChecked(
    actor: AuthUser,
    siteId: string,
    expectedVersion: number,
    kind: SiteWriteKind,
    tx: Tx,
  ): Promise<{ site: Site; jobs: SiteJobFacts[] }> {
    const site = await findOrFail(this.repository.lock(actor.companyId, siteId, tx), siteNotFound);
    const jobs = await this.repository.jobs(siteId, tx, kind === 'geometry');
    const decision = canWriteSite({ role: actor.role, userId: actor.id }, jobs, kind);
    if (!decision.isAllowed) throw siteDenied(decision);
    if (site.version !== expectedVersion) throw siteVersionConflict(site.version);
    return { site, jobs };
  }

  async write<T extends object>(
    actor: AuthUser,
    siteId: string,
    expectedVersion: number,
    kind: SiteWriteKind,
    work: (ctx: SiteWriteContext) => Promise<SiteWorkOutcome<T>>,
  ): Promise<T & SiteVersionResponse> {
    return this.repository.transaction(async (tx) => {
      const { site, jobs } = await this.lockChecked(actor, siteId, expectedVersion, kind, tx);
      const outcome = await work({ tx, site, jobs });
      const { audit } = outcome;
      const siteVersion = await this.repository.bumpSite(site.id, tx);
      const openJobIds = kind === 'geometry' ? jobs.filter((j) => SITE_OPEN_JOB_STATUSES.includes(j.status)).map((j) => j.id) : [];
      const jobVersions = await this.repository.bumpJobs(openJobIds, tx);
      await this.audit.record(
        {
          companyId: actor.companyId,
          actorUserId: actor.id,
          action: audit.action,
          targetType: audit.targetType,
          targetId: audit.targetId,
          details: { siteId: site.id, siteVersion, ...(openJobIds.length > 0 ? { jobVersions } : {}), ...audit.details },
        },
        tx,
      );
      const result = 'readAfter' in outcome ? await outcome.readAfter() : outcome.result;
      return { ...result, siteVersion, jobVersions };
    });
  }
}
