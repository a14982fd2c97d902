import { Inject, Injectable } from '@nestjs/common';
import { and, asc, count, desc, eq, gt, inArray, isNull, max, or, sql } from 'drizzle-orm';

import { DB, type Db, type Tx } from '../db/db.module.js';
import {
  companies,
  companySettings,
  depthReadings,
  jobs,
  type LocateLink,
  locateLinkAccesses,
  locateLinks,
  type NewLocateLink,
  packetRevisions,
  photoDerivatives,
  photos,
  revisionLocateLinks,
  siteHomeowners,
  sites,
  users,
} from '../db/schema/index.js';
import type { PhotoDerivativeVariant } from '../domain/photos/photo.schema.js';

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

export interface LocateLinkWithStats {
  link: LocateLink;
  createdByName: string | null;
  accessCount: number;
  lastAccessedAt: Date | null;
}

/** Locate links, their accesses, and the read-only site data the public view and the portal show. */
@Injectable()
export class LocateRepository {
  constructor(@Inject(DB) private readonly db: Db) {}

  transaction<T>(work: (tx: Tx) => Promise<T>): Promise<T> {
    return this.db.transaction(work);
  }

  /** The site, when it belongs to the company. */
  async siteInCompany(companyId: string, siteId: string, tx?: Tx) {
    const [row] = await (tx ?? this.db).select().from(sites).where(and(eq(sites.companyId, companyId), eq(sites.id, siteId)));
    return row;
  }

  /** The site, when the homeowner is linked to it (site_homeowners). */
  async siteOfHomeowner(userId: string, siteId: string, tx?: Tx) {
    const [row] = await (tx ?? this.db)
      .select({ site: sites })
      .from(sites)
      .innerJoin(siteHomeowners, and(eq(siteHomeowners.siteId, sites.id), eq(siteHomeowners.userId, userId)))
      .where(eq(sites.id, siteId));
    return row?.site;
  }

  async insertLink(link: NewLocateLink, tx?: Tx): Promise<LocateLink> {
    const [row] = await (tx ?? this.db).insert(locateLinks).values(link).returning();
    return row!;
  }

  /** The site's links, newest first, with who made them and how often they were opened. */
  async listBySite(siteId: string): Promise<LocateLinkWithStats[]> {
    const stats = this.db
      .select({ linkId: locateLinkAccesses.linkId, n: count().as('n'), last: max(locateLinkAccesses.accessedAt).as('last') })
      .from(locateLinkAccesses)
      .groupBy(locateLinkAccesses.linkId)
      .as('stats');
    const rows = await this.db
      .select({ link: locateLinks, createdByName: users.name, accessCount: stats.n, lastAccessedAt: stats.last })
      .from(locateLinks)
      .leftJoin(users, eq(users.id, locateLinks.createdByUserId))
      .leftJoin(stats, eq(stats.linkId, locateLinks.id))
      .where(eq(locateLinks.siteId, siteId))
      .orderBy(desc(locateLinks.createdAt), desc(locateLinks.id));
    return rows.map((r) => ({
      link: r.link,
      createdByName: r.createdByName,
      accessCount: Number(r.accessCount ?? 0),
      // The aggregate comes back as text through the subquery.
      lastAccessedAt: r.lastAccessedAt ? new Date(r.lastAccessedAt as unknown as string) : null,
    }));
  }

  async findLink(id: string, tx?: Tx): Promise<LocateLink | undefined> {
    const [row] = await (tx ?? this.db).select().from(locateLinks).where(eq(locateLinks.id, id));
    return row;
  }

  async revoke(id: string, tx: Tx): Promise<LocateLink | undefined> {
    const [row] = await tx
      .update(locateLinks)
      .set({ revokedAt: sql`coalesce(${locateLinks.revokedAt}, now())` })
      .where(eq(locateLinks.id, id))
      .returning();
    return row;
  }

  /** The link with this token hash when it is usable now (not expired, not revoked). */
  async findActiveByHash(tokenHash: string): Promise<LocateLink | undefined> {
    const [row] = await this.db
      .select()
      .from(locateLinks)
      .where(and(eq(locateLinks.tokenHash, tokenHash), isNull(locateLinks.revokedAt), gt(locateLinks.expiresAt, sql`now()`)));
    return row;
  }

  async logAccess(linkId: string, ip: string | null, userAgent: string | null): Promise<void> {
    await this.db.insert(locateLinkAccesses).values({ linkId, ip, userAgent });
  }

  /**
   * The URL of an active long-lived link of the site that a packet revision already prints, if any:
   * its token is known only through that revision (see revisionLocateLinks).
   */
  async activeLongLivedUrl(siteId: string, tx: Tx): Promise<{ linkId: string; url: string } | undefined> {
    const [row] = await tx
      .select({ linkId: revisionLocateLinks.linkId, url: revisionLocateLinks.url })
      .from(revisionLocateLinks)
      .innerJoin(locateLinks, eq(locateLinks.id, revisionLocateLinks.linkId))
      .where(
        and(
          eq(locateLinks.siteId, siteId),
          eq(locateLinks.isLongLived, true),
          isNull(locateLinks.revokedAt),
          gt(locateLinks.expiresAt, sql`now() + interval '30 days'`),
        ),
      )
      .orderBy(desc(locateLinks.createdAt))
      .limit(1);
    return row;
  }

  /** Moves a link's expiry to `expiresAt` when that is later (a renewal never shortens a link). */
  async renewLink(linkId: string, expiresAt: Date, tx: Tx): Promise<void> {
    await tx
      .update(locateLinks)
      .set({ expiresAt: sql`greatest(${locateLinks.expiresAt}, ${expiresAt.toISOString()}::timestamptz)` })
      .where(eq(locateLinks.id, linkId));
  }

  async attachToRevision(revisionId: string, linkId: string, url: string, tx: Tx): Promise<void> {
    await tx.insert(revisionLocateLinks).values({ revisionId, linkId, url });
  }

  /** What the installer block shows: company name and its printed contact details. */
  async installer(companyId: string) {
    const [row] = await this.db
      .select({
        companyName: companies.name,
        phone: companySettings.contactPhone,
        email: companySettings.contactEmail,
        licenceNumbers: companySettings.licenceNumbers,
        units: companySettings.units,
        paperSize: companySettings.paperSize,
        locale: companySettings.locale,
        timeZone: companySettings.timeZone,
      })
      .from(companies)
      .leftJoin(companySettings, eq(companySettings.companyId, companies.id))
      .where(eq(companies.id, companyId));
    return {
      companyName: row?.companyName ?? '',
      phone: row?.phone ?? null,
      email: row?.email ?? null,
      licenceNumbers: row?.licenceNumbers ?? [],
      units: row?.units ?? ('imperial' as const),
      paperSize: row?.paperSize ?? ('letter' as const),
      locale: row?.locale ?? 'en-US',
      timeZone: row?.timeZone ?? null,
    };
  }

  /**
   * The newest ready revision of every job at the site, with its snapshot: what the site map is built
   * from (revisions are immutable, so the map is too until the next issue).
   */
  async latestReadyRevisions(siteId: string) {
    return this.db
      .selectDistinctOn([packetRevisions.jobId], {
        id: packetRevisions.id,
        jobId: packetRevisions.jobId,
        jobTitle: jobs.title,
        revision: packetRevisions.revision,
        issuedAt: packetRevisions.issuedAt,
        snapshot: packetRevisions.snapshot,
      })
      .from(packetRevisions)
      .innerJoin(jobs, eq(jobs.id, packetRevisions.jobId))
      .where(and(eq(jobs.siteId, siteId), eq(packetRevisions.status, 'ready')))
      .orderBy(packetRevisions.jobId, desc(packetRevisions.revision));
  }

  /**
   * Photos of the open trench for the public view: not deleted, on a job of the site with a ready
   * revision, attached to one of `runIds` (directly or through one of its depth readings).
   */
  async runPhotos(siteId: string, runIds: readonly string[]) {
    // Snapshot ids are uuids for recorded jobs, but a snapshot may carry others (imported as-builts):
    // those cannot have photos, and comparing them with a uuid column would fail.
    const ids = runIds.filter((id) => UUID.test(id));
    // Guard against running an invalid `IN ()` query for a site without runs.
    if (ids.length === 0) return [];
    return this.db
      .select({
        id: photos.id,
        runId: sql<string>`coalesce(${photos.runId}, ${depthReadings.runId})`,
        caption: photos.caption,
        exifTakenAt: photos.exifTakenAt,
        clientTakenAt: photos.clientTakenAt,
        createdAt: photos.createdAt,
      })
      .from(photos)
      .innerJoin(jobs, eq(jobs.id, photos.jobId))
      .leftJoin(depthReadings, eq(depthReadings.id, photos.depthReadingId))
      .where(
        and(
          eq(jobs.siteId, siteId),
          isNull(photos.deletedAt),
          or(inArray(photos.runId, ids), inArray(depthReadings.runId, ids)),
          sql`exists (select 1 from ${packetRevisions} where ${packetRevisions.jobId} = ${jobs.id} and ${packetRevisions.status} = 'ready')`,
        ),
      )
      .orderBy(asc(photos.createdAt), asc(photos.id));
  }

  /** A metadata-free derivative of a photo on an issued job of the site; never the original. */
  async sitePhotoDerivative(siteId: string, photoId: string, variant: Extract<PhotoDerivativeVariant, 'thumb' | 'screen'>) {
    const [row] = await this.db
      .select({ key: photoDerivatives.key, contentType: photoDerivatives.contentType, runId: photos.runId, depthReadingId: photos.depthReadingId })
      .from(photos)
      .innerJoin(jobs, eq(jobs.id, photos.jobId))
      .innerJoin(photoDerivatives, and(eq(photoDerivatives.photoId, photos.id), eq(photoDerivatives.variant, variant)))
      .where(
        and(
          eq(photos.id, photoId),
          eq(jobs.siteId, siteId),
          isNull(photos.deletedAt),
          sql`exists (select 1 from ${packetRevisions} where ${packetRevisions.jobId} = ${jobs.id} and ${packetRevisions.status} = 'ready')`,
        ),
      );
    return row;
  }
}
