import { sql } from 'drizzle-orm';
import { index, pgTable, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core';

import { companies } from './companies.js';

/**
 * One-time codes an operator makes with `npm run company:invite` so that a company may sign up while
 * SIGNUP_MODE=invite. Only the code's hash is kept; a code is used up by the sign-up it created.
 */
export const companyInviteCodes = pgTable(
  'company_invite_codes',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    codeHash: text('code_hash').notNull(),
    /** Who the operator made it for (free text, shown only to operators). */
    note: text('note'),
    expiresAt: timestamp('expires_at', { withTimezone: true }).notNull(),
    usedAt: timestamp('used_at', { withTimezone: true }),
    usedByCompanyId: uuid('used_by_company_id').references(() => companies.id),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [uniqueIndex('company_invite_codes_code_hash_key').on(t.codeHash)],
);

/**
 * A company sign-up waiting for its e-mail address to be verified. Following the link creates the
 * company and its first admin in one transaction (completed_at, company_id). Nothing else exists
 * until then. At most one open sign-up per address: a newer one supersedes the older.
 */
export const companySignups = pgTable(
  'company_signups',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    /** Stored lower-cased, like users.email. */
    email: text('email').notNull(),
    companyName: text('company_name').notNull(),
    adminName: text('admin_name').notNull(),
    passwordHash: text('password_hash').notNull(),
    /** Hash of the verification link's token; sealed (a hash nobody holds a token for) until the mail goes. */
    tokenHash: text('token_hash').notNull(),
    expiresAt: timestamp('expires_at', { withTimezone: true }).notNull(),
    inviteCodeId: uuid('invite_code_id').references(() => companyInviteCodes.id),
    completedAt: timestamp('completed_at', { withTimezone: true }),
    companyId: uuid('company_id').references(() => companies.id),
    supersededAt: timestamp('superseded_at', { withTimezone: true }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    uniqueIndex('company_signups_token_hash_key').on(t.tokenHash),
    index('company_signups_email_idx').on(t.email),
    uniqueIndex('company_signups_open_email_key')
      .on(t.email)
      .where(sql`${t.completedAt} is null and ${t.supersededAt} is null`),
  ],
);

export type CompanyInviteCode = typeof companyInviteCodes.$inferSelect;
export type CompanySignup = typeof companySignups.$inferSelect;
export type NewCompanySignup = typeof companySignups.$inferInsert;
