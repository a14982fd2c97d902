import { sql } from 'drizzle-orm';
import { bigserial, boolean, check, index, integer, pgEnum, pgTable, primaryKey, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core';

import { companies } from './companies.js';
import { packetRevisions } from './packets.js';
import { sites } from './sites.js';
import { invitations, users } from './users.js';

export const deliveryStatus = pgEnum('delivery_status', ['queued', 'sending', 'sent', 'failed']);

/**
 * One e-mail of a packet revision to one recipient (with its CCs): the delivery log. A row is written
 * before the message is queued, so a send is never lost; the worker moves it queued → sending → sent,
 * or back to queued after a failed attempt and to failed when no retry is left.
 */
export const packetDeliveries = pgTable(
  'packet_deliveries',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    companyId: uuid('company_id')
      .notNull()
      .references(() => companies.id),
    revisionId: uuid('revision_id')
      .notNull()
      .references(() => packetRevisions.id, { onDelete: 'cascade' }),
    toAddress: text('to_address').notNull(),
    ccAddresses: text('cc_addresses').array().notNull().default(sql`'{}'::text[]`),
    /** The sender's note, printed in the message. */
    message: text('message'),
    status: deliveryStatus('status').notNull().default('queued'),
    /** Send attempts started (each worker pick-up adds one). */
    attempts: integer('attempts').notNull().default(0),
    lastError: text('last_error'),
    /** The sender's choice: attach the PDF (when it is within MAIL_MAX_ATTACHMENT_BYTES) or send the link only. */
    wantsPdfAttached: boolean('wants_pdf_attached').notNull().default(true),
    /** Whether the PDF went as an attachment (null until sent; false: link only, chosen or too large). */
    isPdfAttached: boolean('is_pdf_attached'),
    messageId: text('message_id'),
    /** The homeowner invitation sent with this delivery, when the recipient had no account. */
    invitationId: uuid('invitation_id').references(() => invitations.id, { onDelete: 'set null' }),
    requestedByUserId: uuid('requested_by_user_id').references(() => users.id, { onDelete: 'set null' }),
    sentAt: timestamp('sent_at', { withTimezone: true }),
    /** A failed delivery the office has set aside: no longer shown as needing attention. */
    dismissedAt: timestamp('dismissed_at', { withTimezone: true }),
    dismissedByUserId: uuid('dismissed_by_user_id').references(() => users.id, { onDelete: 'set null' }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index('packet_deliveries_revision_id_created_at_idx').on(t.revisionId, t.createdAt),
    index('packet_deliveries_company_id_status_idx').on(t.companyId, t.status),
    index('packet_deliveries_status_updated_at_idx').on(t.status, t.updatedAt),
    check('packet_deliveries_sent_has_time', sql`${t.status} <> 'sent' or ${t.sentAt} is not null`),
  ],
);

/**
 * A read-only link to a site's buried-cable map for someone without an account. Only the SHA-256 of
 * the token is stored; the token itself is shown once, when the link is made. Long-lived links are
 * the ones created when a packet is issued (their URL is printed as the packet's QR code).
 */
export const locateLinks = pgTable(
  'locate_links',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    companyId: uuid('company_id')
      .notNull()
      .references(() => companies.id),
    siteId: uuid('site_id')
      .notNull()
      .references(() => sites.id, { onDelete: 'cascade' }),
    createdByUserId: uuid('created_by_user_id').references(() => users.id, { onDelete: 'set null' }),
    tokenHash: text('token_hash').notNull(),
    note: text('note'),
    expiresAt: timestamp('expires_at', { withTimezone: true }).notNull(),
    revokedAt: timestamp('revoked_at', { withTimezone: true }),
    isLongLived: boolean('is_long_lived').notNull().default(false),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    uniqueIndex('locate_links_token_hash_key').on(t.tokenHash),
    index('locate_links_site_id_created_at_idx').on(t.siteId, t.createdAt),
  ],
);

/** Every open of a locate link (the public view and its files), for the owner's "who looked" list. */
export const locateLinkAccesses = pgTable(
  'locate_link_accesses',
  {
    id: bigserial('id', { mode: 'number' }).primaryKey(),
    linkId: uuid('link_id')
      .notNull()
      .references(() => locateLinks.id, { onDelete: 'cascade' }),
    accessedAt: timestamp('accessed_at', { withTimezone: true }).notNull().defaultNow(),
    ip: text('ip'),
    userAgent: text('user_agent'),
  },
  (t) => [index('locate_link_accesses_link_id_accessed_at_idx').on(t.linkId, t.accessedAt)],
);

/**
 * The locate URL a packet revision prints as its QR code. The token is kept in clear here (and nowhere
 * else) because the worker must print it, possibly long after the issue request that made the link.
 * Trade-off: whoever reads this table can open the link — but the same URL is printed in the PDF kept
 * in storage, so this adds no exposure the packet does not already have; revoking the link disables both.
 */
export const revisionLocateLinks = pgTable('revision_locate_links', {
  revisionId: uuid('revision_id')
    .primaryKey()
    .references(() => packetRevisions.id, { onDelete: 'cascade' }),
  linkId: uuid('link_id')
    .notNull()
    .references(() => locateLinks.id, { onDelete: 'cascade' }),
  url: text('url').notNull(),
});

/** Sites an invited homeowner is linked to when they accept the invitation. */
export const invitationSites = pgTable(
  'invitation_sites',
  {
    invitationId: uuid('invitation_id')
      .notNull()
      .references(() => invitations.id, { onDelete: 'cascade' }),
    siteId: uuid('site_id')
      .notNull()
      .references(() => sites.id, { onDelete: 'cascade' }),
  },
  (t) => [primaryKey({ columns: [t.invitationId, t.siteId] })],
);

export type PacketDelivery = typeof packetDeliveries.$inferSelect;
export type NewPacketDelivery = typeof packetDeliveries.$inferInsert;
export type LocateLink = typeof locateLinks.$inferSelect;
export type NewLocateLink = typeof locateLinks.$inferInsert;
