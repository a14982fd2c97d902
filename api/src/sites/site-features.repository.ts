import { Inject, Injectable } from '@nestjs/common';
import { and, asc, count, eq } from 'drizzle-orm';

import { DB, type Db, type Tx } from '../db/db.module.js';
import { type NewSiteFeatureRow, type SiteFeatureRow, siteFeatures, sites } from '../db/schema/index.js';

/** The site features (landmarks) of a site. */
@Injectable()
export class SiteFeaturesRepository {
  constructor(@Inject(DB) private readonly db: Db) {}

  /** Is the site the company's? (Reads do not lock: features are listed like the site itself.) */
  async siteExists(companyId: string, siteId: string): Promise<boolean> {
    const [row] = await this.db
      .select({ id: sites.id })
      .from(sites)
      .where(and(eq(sites.companyId, companyId), eq(sites.id, siteId)));
    return row !== undefined;
  }

  list(siteId: string, tx?: Tx): Promise<SiteFeatureRow[]> {
    return (tx ?? this.db).select().from(siteFeatures).where(eq(siteFeatures.siteId, siteId)).orderBy(asc(siteFeatures.seq));
  }

  async countOnSite(siteId: string, tx: Tx): Promise<number> {
    const [row] = await tx.select({ n: count() }).from(siteFeatures).where(eq(siteFeatures.siteId, siteId));
    return row?.n ?? 0;
  }

  async find(siteId: string, id: string, tx: Tx): Promise<SiteFeatureRow | undefined> {
    const [row] = await tx
      .select()
      .from(siteFeatures)
      .where(and(eq(siteFeatures.siteId, siteId), eq(siteFeatures.id, id)));
    return row;
  }

  async insert(row: NewSiteFeatureRow, tx: Tx): Promise<SiteFeatureRow> {
    const [created] = await tx.insert(siteFeatures).values(row).returning();
    return created!;
  }

  async update(siteId: string, id: string, patch: Partial<Pick<NewSiteFeatureRow, 'kind' | 'name' | 'shape' | 'points'>>, tx: Tx): Promise<SiteFeatureRow | undefined> {
    const [row] = await tx
      .update(siteFeatures)
      .set({ ...patch, updatedAt: new Date() })
      .where(and(eq(siteFeatures.siteId, siteId), eq(siteFeatures.id, id)))
      .returning();
    return row;
  }

  async delete(siteId: string, id: string, tx: Tx): Promise<boolean> {
    const rows = await tx
      .delete(siteFeatures)
      .where(and(eq(siteFeatures.siteId, siteId), eq(siteFeatures.id, id)))
      .returning({ id: siteFeatures.id });
    return rows.length > 0;
  }
}
