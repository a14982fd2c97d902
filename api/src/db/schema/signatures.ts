import { pgTable, text, timestamp, unique, uuid } from 'drizzle-orm/pg-core';

import { jobs } from './jobs.js';
import { signatureRole } from './packets.js';
import { users } from './users.js';

/**
 * Signatures captured at the walkthrough, before the packet is issued: one per role on the job's next
 * revision. Issuing copies them into `packet_signatures` (which then never change) and clears these,
 * so a reopened job is signed again for its next revision.
 */
export const jobSignatures = pgTable(
  'job_signatures',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    jobId: uuid('job_id')
      .notNull()
      .references(() => jobs.id, { onDelete: 'cascade' }),
    role: signatureRole('role').notNull(),
    signerName: text('signer_name').notNull(),
    signedAt: timestamp('signed_at', { withTimezone: true }).notNull(),
    /** SVG path `d` data in a 0 0 400 120 box. */
    svgPath: text('svg_path').notNull(),
    capturedByUserId: uuid('captured_by_user_id').references(() => users.id, { onDelete: 'set null' }),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [unique('job_signatures_job_id_role_key').on(t.jobId, t.role)],
);

export type JobSignatureRow = typeof jobSignatures.$inferSelect;
