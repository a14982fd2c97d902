import { Inject, Injectable } from '@nestjs/common';
import { eq, sql } from 'drizzle-orm';

import { DB, type Db, type Tx } from '../db/db.module.js';
import { type CompanySettingsRow, companySettings, type UserPreferencesRow, userPreferences } from '../db/schema/index.js';
import type { GaugeUnits, LengthUnits, PaperSize } from '../domain/settings/settings.schema.js';

/** The company's defaults (company_settings) and each person's own choices (user_preferences). */
@Injectable()
export class SettingsRepository {
  constructor(@Inject(DB) private readonly db: Db) {}

  transaction<T>(work: (tx: Tx) => Promise<T>): Promise<T> {
    return this.db.transaction(work);
  }

  /** The company's settings; the row is created with the defaults on first use, as packets do. */
  async companySettings(companyId: string, tx?: Tx): Promise<CompanySettingsRow> {
    const db = tx ?? this.db;
    await db.insert(companySettings).values({ companyId }).onConflictDoNothing();
    const [row] = await db.select().from(companySettings).where(eq(companySettings.companyId, companyId));
    return row!;
  }

  async updateCompanySettings(
    companyId: string,
    patch: { units?: LengthUnits; gaugeUnits?: GaugeUnits; paperSize?: PaperSize },
    tx: Tx,
  ): Promise<CompanySettingsRow> {
    await tx.insert(companySettings).values({ companyId }).onConflictDoNothing();
    const [row] = await tx
      .update(companySettings)
      .set({ ...patch, updatedAt: new Date() })
      .where(eq(companySettings.companyId, companyId))
      .returning();
    return row!;
  }

  /** The person's own choices, or `undefined` when they never chose (everything follows the company). */
  async userPreferences(userId: string, tx?: Tx): Promise<UserPreferencesRow | undefined> {
    const [row] = await (tx ?? this.db).select().from(userPreferences).where(eq(userPreferences.userId, userId));
    return row;
  }

  /** Sets the given columns (null = follow the company again) and leaves the others as they are. */
  async upsertUserPreferences(
    userId: string,
    patch: { lengthUnits?: LengthUnits | null; gaugeUnits?: GaugeUnits | null },
    tx: Tx,
  ): Promise<UserPreferencesRow> {
    const [row] = await tx
      .insert(userPreferences)
      .values({ userId, ...patch })
      .onConflictDoUpdate({ target: userPreferences.userId, set: { ...patch, updatedAt: sql`now()` } })
      .returning();
    return row!;
  }
}
