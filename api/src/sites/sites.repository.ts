import { Inject, Injectable } from '@nestjs/common';
import { and, asc, count, desc, eq, ilike, inArray, or, type SQL, sql } from 'drizzle-orm';

import { DB, type Db, type Tx } from '../db/db.module.js';
import { afterCursor } from '../db/keyset.js';
import { type CursorPageQuery, cursorLimit, cursorPageOffset } from '../domain/paging/page.schema.js';
import {
  customers,
  jobs,
  type NewReferencePointRow,
  packetRevisions,
  type NewSite,
  type ReferencePointRow,
  referencePoints,
  type Site,
  siteHomeowners,
  sites,
  users,
} from '../db/schema/index.js';

function likePattern(q: string): string {
  return `%${q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
}

export type SiteWithCustomer = { site: Site; customer: { id: string; name: string } };

/** Every method takes the company id from the signed-in user, or a site id the service checked first. */
@Injectable()
export class SitesRepository {
  constructor(@Inject(DB) private readonly db: Db) {}

  transaction<T>(work: (tx: Tx) => Promise<T>): Promise<T> {
    return this.db.transaction(work);
  }

  /**
   * One page of the company's sites matching the query by label (with one row more than the page, to
   * tell whether another follows), and how many match in all.
   */
  async list(companyId: string, query: { q?: string; customerId?: string } & CursorPageQuery): Promise<{ rows: SiteWithCustomer[]; total: number }> {
    const conditions: (SQL | undefined)[] = [eq(sites.companyId, companyId)];
    if (query.customerId) conditions.push(eq(sites.customerId, query.customerId));
    if (query.q) {
      const p = likePattern(query.q);
      conditions.push(or(ilike(sites.label, p), ilike(sites.addressLine1, p), ilike(sites.city, p), ilike(customers.name, p)));
    }
    const [rows, [counted]] = await Promise.all([
      this.db
        .select({ site: sites, customer: { id: customers.id, name: customers.name } })
        .from(sites)
        .innerJoin(customers, eq(customers.id, sites.customerId))
        .where(and(...conditions, afterCursor(sites.label, sites.id, query.cursor)))
        .orderBy(asc(sites.label), asc(sites.id))
        .limit(cursorLimit(query))
        .offset(cursorPageOffset(query)),
      this.db
        .select({ n: count() })
        .from(sites)
        .innerJoin(customers, eq(customers.id, sites.customerId))
        .where(and(...conditions)),
    ]);
    return { rows, total: counted?.n ?? 0 };
  }

  async findInCompany(companyId: string, id: string, tx?: Tx): Promise<SiteWithCustomer | undefined> {
    const [row] = await (tx ?? this.db)
      .select({ site: sites, customer: { id: customers.id, name: customers.name } })
      .from(sites)
      .innerJoin(customers, eq(customers.id, sites.customerId))
      .where(and(eq(sites.companyId, companyId), eq(sites.id, id)));
    return row;
  }

  async customerInCompany(companyId: string, customerId: string, tx: Tx): Promise<boolean> {
    const [row] = await tx
      .select({ id: customers.id })
      .from(customers)
      .where(and(eq(customers.companyId, companyId), eq(customers.id, customerId)));
    return row !== undefined;
  }

  referencePoints(siteId: string, tx?: Tx): Promise<ReferencePointRow[]> {
    return (tx ?? this.db).select().from(referencePoints).where(eq(referencePoints.siteId, siteId)).orderBy(asc(referencePoints.seq));
  }

  homeowners(siteId: string, tx?: Tx) {
    return (tx ?? this.db)
      .select({ id: users.id, name: users.name, email: users.email })
      .from(siteHomeowners)
      .innerJoin(users, eq(users.id, siteHomeowners.userId))
      .where(eq(siteHomeowners.siteId, siteId))
      .orderBy(asc(users.name));
  }

  jobs(siteId: string, tx?: Tx) {
    return (tx ?? this.db)
      .select({ id: jobs.id, title: jobs.title, status: jobs.status, revision: jobs.revision, updatedAt: jobs.updatedAt })
      .from(jobs)
      .where(eq(jobs.siteId, siteId))
      .orderBy(desc(jobs.updatedAt));
  }

  async insert(site: NewSite, tx: Tx): Promise<Site> {
    const [row] = await tx.insert(sites).values(site).returning();
    return row!;
  }

  async updateInCompany(companyId: string, id: string, patch: Partial<NewSite>, tx: Tx): Promise<Site | undefined> {
    const [row] = await tx
      .update(sites)
      .set({ ...patch, updatedAt: new Date() })
      .where(and(eq(sites.companyId, companyId), eq(sites.id, id)))
      .returning();
    return row;
  }

  async deleteInCompany(companyId: string, id: string, tx: Tx): Promise<boolean> {
    const rows = await tx
      .delete(sites)
      .where(and(eq(sites.companyId, companyId), eq(sites.id, id)))
      .returning({ id: sites.id });
    return rows.length > 0;
  }

  async insertReferencePoint(point: NewReferencePointRow, tx: Tx): Promise<ReferencePointRow> {
    const [row] = await tx.insert(referencePoints).values(point).returning();
    return row!;
  }

  async updateReferencePoint(siteId: string, id: string, patch: Partial<NewReferencePointRow>, tx: Tx) {
    const [row] = await tx
      .update(referencePoints)
      .set(patch)
      .where(and(eq(referencePoints.siteId, siteId), eq(referencePoints.id, id)))
      .returning();
    return row;
  }

  async deleteReferencePoint(siteId: string, id: string, tx: Tx): Promise<boolean> {
    const rows = await tx
      .delete(referencePoints)
      .where(and(eq(referencePoints.siteId, siteId), eq(referencePoints.id, id)))
      .returning({ id: referencePoints.id });
    return rows.length > 0;
  }

  /** The site when `userId` is a homeowner linked to it (site_homeowners). */
  async findLinkedToHomeowner(userId: string, siteId: string): Promise<Site | undefined> {
    const [row] = await this.db
      .select({ site: sites })
      .from(sites)
      .innerJoin(siteHomeowners, and(eq(siteHomeowners.siteId, sites.id), eq(siteHomeowners.userId, userId)))
      .where(eq(sites.id, siteId));
    return row?.site;
  }

  /** Locks the site row for a plan-image change (two uploads at once: the last one wins, cleanly). */
  async lockInCompany(companyId: string, id: string, tx: Tx): Promise<Site | undefined> {
    const [row] = await tx
      .select()
      .from(sites)
      .where(and(eq(sites.companyId, companyId), eq(sites.id, id)))
      .for('update');
    return row;
  }

  /**
   * Which of `keys` an issued packet's snapshot still names as its plan underlay: those stay stored when
   * the site's image is replaced or removed, so a revision re-rendered later prints what was issued.
   */
  async planImageKeysInPackets(keys: readonly string[], tx?: Tx): Promise<Set<string>> {
    if (keys.length === 0) return new Set();
    const screenKey = sql<string>`${packetRevisions.snapshot} -> 'site' -> 'planImage' ->> 'screenKey'`;
    const rows = await (tx ?? this.db)
      .selectDistinct({ key: screenKey })
      .from(packetRevisions)
      .where(inArray(screenKey, [...keys]));
    return new Set(rows.map((r) => r.key));
  }

  async homeownerInCompany(companyId: string, userId: string, tx: Tx): Promise<boolean> {
    const [row] = await tx
      .select({ id: users.id })
      .from(users)
      .where(and(eq(users.companyId, companyId), eq(users.id, userId), eq(users.role, 'homeowner')));
    return row !== undefined;
  }

  async linkHomeowner(siteId: string, userId: string, tx: Tx): Promise<void> {
    await tx.insert(siteHomeowners).values({ siteId, userId }).onConflictDoNothing();
  }

  async unlinkHomeowner(siteId: string, userId: string, tx: Tx): Promise<boolean> {
    const rows = await tx
      .delete(siteHomeowners)
      .where(and(eq(siteHomeowners.siteId, siteId), eq(siteHomeowners.userId, userId)))
      .returning({ userId: siteHomeowners.userId });
    return rows.length > 0;
  }
}
