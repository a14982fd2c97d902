import { sql } from 'drizzle-orm';
import { bigint, check, index, integer, jsonb, pgEnum, pgTable, text, timestamp, unique, uuid } from 'drizzle-orm/pg-core';

import type { DepthRuleTable } from '../../domain/depth/depth-rules.schema.js';
import type { PacketSnapshot } from '../../domain/packet/packet-snapshot.js';
import { companies } from './companies.js';
import { gaugeSystem, jobs } from './jobs.js';
import { users } from './users.js';

export const paperSize = pgEnum('paper_size', ['letter', 'a4']);
export const unitSystem = pgEnum('unit_system', ['imperial', 'metric']);

/**
 * What the company prints on its packets. One row per company, created with the defaults on first
 * use (letter, imperial), so a company without settings still issues packets.
 */
export const companySettings = pgTable('company_settings', {
  companyId: uuid('company_id')
    .primaryKey()
    .references(() => companies.id, { onDelete: 'cascade' }),
  paperSize: paperSize('paper_size').notNull().default('letter'),
  units: unitSystem('units').notNull().default('imperial'),
  /** The company's default for wire sizes in the app (each user may override it, see user_preferences). */
  gaugeUnits: gaugeSystem('gauge_units').notNull().default('awg'),
  /** Licence numbers as printed, e.g. "CA C-7 #1234567". */
  licenceNumbers: text('licence_numbers').array().notNull().default(sql`'{}'::text[]`),
  contactPhone: text('contact_phone'),
  contactEmail: text('contact_email'),
  /**
   * Storage key of the logo: a normalised PNG (bounded size, no metadata) named by its SHA-256, never
   * overwritten, so a packet revision that copied the key at issue time always finds the same picture.
   */
  logoKey: text('logo_key'),
  /** Company profile (issue 14): shown on packets, the homeowner portal and the locate view. */
  website: text('website'),
  /** Postal address as printed, one line per line. */
  postalAddress: text('postal_address'),
  /** IANA time zone name (checked with Intl); null until the admin chooses one. */
  timeZone: text('time_zone'),
  /** BCP 47 locale for dates and numbers. */
  locale: text('locale').notNull().default('en-US'),
  /** The company's depth rule table (DepthRuleTable); null follows the shipped defaults. */
  depthRules: jsonb('depth_rules').$type<DepthRuleTable>(),
  updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
});

export const packetStatus = pgEnum('packet_status', ['queued', 'rendering', 'ready', 'failed']);

/**
 * One issued revision of a job's handover packet. The snapshot is the immutable document source (the
 * one place a JSON document is right: it must never change when the live record does). The PDF and
 * archive columns are filled once, by the render worker, when both are stored.
 */
export const packetRevisions = pgTable(
  'packet_revisions',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    companyId: uuid('company_id')
      .notNull()
      .references(() => companies.id),
    jobId: uuid('job_id')
      .notNull()
      .references(() => jobs.id),
    revision: integer('revision').notNull(),
    status: packetStatus('status').notNull().default('queued'),
    failureReason: text('failure_reason'),
    /** Render attempts started (each worker pick-up adds one). */
    attempts: integer('attempts').notNull().default(0),
    snapshot: jsonb('snapshot').$type<PacketSnapshot>().notNull(),
    paperSize: paperSize('paper_size').notNull(),
    pdfKey: text('pdf_key'),
    pdfBytes: bigint('pdf_bytes', { mode: 'number' }),
    pdfSha256: text('pdf_sha256'),
    pageCount: integer('page_count'),
    zipKey: text('zip_key'),
    zipBytes: bigint('zip_bytes', { mode: 'number' }),
    zipSha256: text('zip_sha256'),
    issuedByUserId: uuid('issued_by_user_id').references(() => users.id, { onDelete: 'set null' }),
    issuedAt: timestamp('issued_at', { withTimezone: true }).notNull().defaultNow(),
    renderedAt: timestamp('rendered_at', { withTimezone: true }),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    unique('packet_revisions_job_id_revision_key').on(t.jobId, t.revision),
    index('packet_revisions_company_id_issued_at_idx').on(t.companyId, t.issuedAt),
    check('packet_revisions_revision_positive', sql`${t.revision} >= 1`),
    check(
      'packet_revisions_ready_has_files',
      sql`${t.status} <> 'ready' or (${t.pdfKey} is not null and ${t.pdfSha256} is not null and ${t.zipKey} is not null and ${t.zipSha256} is not null)`,
    ),
  ],
);

export const signatureRole = pgEnum('signature_role', ['lead', 'homeowner']);

/** A finger-drawn signature at the walkthrough, stored as SVG path data with the signer's name and time. */
export const packetSignatures = pgTable(
  'packet_signatures',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    revisionId: uuid('revision_id')
      .notNull()
      .references(() => packetRevisions.id, { onDelete: 'cascade' }),
    role: signatureRole('role').notNull(),
    signerName: text('signer_name').notNull(),
    signedAt: timestamp('signed_at', { withTimezone: true }).notNull(),
    /** SVG path `d` data in a 0 0 400 120 box. */
    svgPath: text('svg_path').notNull(),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [unique('packet_signatures_revision_id_role_key').on(t.revisionId, t.role)],
);

export type CompanySettingsRow = typeof companySettings.$inferSelect;
export type PacketRevision = typeof packetRevisions.$inferSelect;
export type NewPacketRevision = typeof packetRevisions.$inferInsert;
export type PacketSignatureRow = typeof packetSignatures.$inferSelect;
