import { Inject, Injectable } from '@nestjs/common';
import { eq } from 'drizzle-orm';

import { DB, type Db, type Tx } from '../db/db.module.js';
import { type CompanySettingsRow, companies, companySettings } from '../db/schema/index.js';
import type { DepthRuleTable } from '../domain/depth/depth-rules.schema.js';

export type CompanyProfileRow = CompanySettingsRow & { tradeName: string };

export interface CompanyProfilePatch {
  tradeName?: string;
  contactPhone?: string | null;
  contactEmail?: string | null;
  website?: string | null;
  postalAddress?: string | null;
  licenceNumbers?: string[];
  timeZone?: string | null;
  locale?: string;
  logoKey?: string | null;
  depthRules?: DepthRuleTable | null;
}

/** The company's profile: its name (companies.name) and the rest of company_settings. */
@Injectable()
export class CompanyProfileRepository {
  constructor(@Inject(DB) private readonly db: Db) {}

  transaction<T>(work: (tx: Tx) => Promise<T>): Promise<T> {
    return this.db.transaction(work);
  }

  /** The profile; the settings row is created with the defaults on first use (as packets do). */
  async profile(companyId: string, tx?: Tx): Promise<CompanyProfileRow> {
    const db = tx ?? this.db;
    await db.insert(companySettings).values({ companyId }).onConflictDoNothing();
    const [row] = await db
      .select({ settings: companySettings, tradeName: companies.name })
      .from(companySettings)
      .innerJoin(companies, eq(companies.id, companySettings.companyId))
      .where(eq(companySettings.companyId, companyId));
    return { ...row!.settings, tradeName: row!.tradeName };
  }

  /** Locks the company's settings row for an update (created first when missing). */
  async lock(companyId: string, tx: Tx): Promise<CompanySettingsRow> {
    await tx.insert(companySettings).values({ companyId }).onConflictDoNothing();
    const [row] = await tx.select().from(companySettings).where(eq(companySettings.companyId, companyId)).for('update');
    return row!;
  }

  async update(companyId: string, patch: CompanyProfilePatch, tx: Tx): Promise<CompanyProfileRow> {
    const { tradeName, ...settings } = patch;
    if (tradeName !== undefined) await tx.update(companies).set({ name: tradeName }).where(eq(companies.id, companyId));
    await tx.insert(companySettings).values({ companyId }).onConflictDoNothing();
    await tx
      .update(companySettings)
      .set({ ...settings, updatedAt: new Date() })
      .where(eq(companySettings.companyId, companyId));
    return this.profile(companyId, tx);
  }
}
