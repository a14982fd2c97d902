import { pgTable, timestamp, uuid } from 'drizzle-orm/pg-core';

import { gaugeSystem } from './jobs.js';
import { unitSystem } from './packets.js';
import { users } from './users.js';

/**
 * A person's own choices that follow them from device to device. A null column follows the company's
 * setting (company_settings), so changing the company default reaches everyone who has not chosen.
 */
export const userPreferences = pgTable('user_preferences', {
  userId: uuid('user_id')
    .primaryKey()
    .references(() => users.id, { onDelete: 'cascade' }),
  lengthUnits: unitSystem('length_units'),
  gaugeUnits: gaugeSystem('gauge_units'),
  updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
});

export type UserPreferencesRow = typeof userPreferences.$inferSelect;
export type NewUserPreferencesRow = typeof userPreferences.$inferInsert;
