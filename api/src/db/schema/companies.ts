import { pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';

/** The tenant: every record of company data belongs to exactly one company. */
export const companies = pgTable('companies', {
  id: uuid('id').primaryKey().defaultRandom(),
  name: text('name').notNull(),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
});

export type Company = typeof companies.$inferSelect;
export type NewCompany = typeof companies.$inferInsert;
