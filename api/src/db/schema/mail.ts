import { customType, index, integer, jsonb, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';

import { companies } from './companies.js';

const bytea = customType<{ data: Buffer; driverData: Buffer }>({ dataType: () => 'bytea' });

/**
 * Messages received by the local SMTP stand-in (development and tests only): what a hosted mail
 * service would have delivered, readable on the Outbox page.
 */
export const capturedMail = pgTable(
  'captured_mail',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    /** From the X-Loamline-Company header our mailer adds; scopes the Outbox per company. */
    companyId: uuid('company_id').references(() => companies.id),
    messageId: text('message_id'),
    fromAddress: text('from_address').notNull(),
    toAddresses: text('to_addresses').array().notNull(),
    subject: text('subject').notNull(),
    text: text('text'),
    html: text('html'),
    headers: jsonb('headers').$type<Record<string, string>>().notNull(),
    sizeBytes: integer('size_bytes').notNull(),
    receivedAt: timestamp('received_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('captured_mail_company_id_received_at_idx').on(t.companyId, t.receivedAt)],
);

export const capturedMailAttachments = pgTable(
  'captured_mail_attachments',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    mailId: uuid('mail_id')
      .notNull()
      .references(() => capturedMail.id, { onDelete: 'cascade' }),
    filename: text('filename').notNull(),
    contentType: text('content_type').notNull(),
    sizeBytes: integer('size_bytes').notNull(),
    content: bytea('content').notNull(),
  },
  (t) => [index('captured_mail_attachments_mail_id_idx').on(t.mailId)],
);

export type CapturedMail = typeof capturedMail.$inferSelect;
export type CapturedMailAttachment = typeof capturedMailAttachments.$inferSelect;
