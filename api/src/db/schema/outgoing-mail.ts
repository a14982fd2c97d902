import { sql } from 'drizzle-orm';
import { check, index, integer, jsonb, pgEnum, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';

import { companies } from './companies.js';
import { companySignups } from './signups.js';
import { invitations, passwordResetTokens } from './users.js';

export const outgoingMailKind = pgEnum('outgoing_mail_kind', ['invitation', 'password_reset', 'signup_verification', 'signup_notice']);
export const outgoingMailStatus = pgEnum('outgoing_mail_status', ['queued', 'sending', 'sent', 'failed', 'cancelled']);

/**
 * Account e-mail waiting to go, or gone: invitations, password resets, company sign-up verifications
 * (no company yet: company_id is null) and the note to an existing account holder whose address was
 * used for a sign-up. A row is written in the same
 * transaction as the invitation or reset it belongs to, so an SMTP outage delays the message without
 * losing it; the account-mail worker moves it queued → sending → sent, back to queued after a failed
 * attempt, failed when no retry is left, or cancelled when its invitation or reset can no longer be used.
 *
 * No link token is stored here (nor anywhere in clear): the worker mints the token when it sends and
 * keeps only its hash on the invitation or reset row (see AccountMailWorker).
 */
export const outgoingMail = pgTable(
  'outgoing_mail',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    /** Null only for a sign-up verification (its company does not exist yet). */
    companyId: uuid('company_id').references(() => companies.id),
    kind: outgoingMailKind('kind').notNull(),
    toAddress: text('to_address').notNull(),
    /** Template values known when the mail was asked for (names, labels); never a link or token. */
    data: jsonb('data').$type<Record<string, string | number | boolean | null>>().notNull(),
    invitationId: uuid('invitation_id').references(() => invitations.id, { onDelete: 'cascade' }),
    passwordResetId: uuid('password_reset_id').references(() => passwordResetTokens.id, { onDelete: 'cascade' }),
    signupId: uuid('signup_id').references(() => companySignups.id, { onDelete: 'cascade' }),
    /**
     * Hash of the receipt a sign-up request got back: with mail captured locally, the sign-up page shows
     * the message sent for that request (there is no one signed in to read the Outbox yet).
     */
    receiptHash: text('receipt_hash'),
    status: outgoingMailStatus('status').notNull().default('queued'),
    /** Send attempts started (each worker pick-up adds one). */
    attempts: integer('attempts').notNull().default(0),
    lastError: text('last_error'),
    messageId: text('message_id'),
    sentAt: timestamp('sent_at', { withTimezone: true }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index('outgoing_mail_status_updated_at_idx').on(t.status, t.updatedAt),
    index('outgoing_mail_invitation_id_idx').on(t.invitationId),
    index('outgoing_mail_password_reset_id_idx').on(t.passwordResetId),
    index('outgoing_mail_signup_id_idx').on(t.signupId),
    index('outgoing_mail_receipt_hash_idx').on(t.receiptHash),
    check('outgoing_mail_sent_has_time', sql`${t.status} <> 'sent' or ${t.sentAt} is not null`),
    // Written without the sign-up kinds' names: a value added to an enum cannot be used in the
    // transaction that adds it (the migration). Sign-up kinds: a verification has its sign-up, a note
    // has its company.
    check(
      'outgoing_mail_kind_has_target',
      sql`(${t.kind} = 'invitation' and ${t.invitationId} is not null and ${t.companyId} is not null) or (${t.kind} = 'password_reset' and ${t.passwordResetId} is not null and ${t.companyId} is not null) or (${t.kind} <> 'invitation' and ${t.kind} <> 'password_reset' and (${t.signupId} is not null or ${t.companyId} is not null))`,
    ),
  ],
);

export type OutgoingMailRow = typeof outgoingMail.$inferSelect;
export type NewOutgoingMailRow = typeof outgoingMail.$inferInsert;
