import { Inject, Injectable } from '@nestjs/common';
import { and, asc, desc, eq, inArray, lt, or, sql } from 'drizzle-orm';

import { DB, type Db, type Tx } from '../db/db.module.js';
import {
  companies,
  companySettings,
  type CompanySettingsRow,
  customers,
  type NewPacketRevision,
  type PacketRevision,
  packetRevisions,
  packetSignatures,
  type PacketSignatureRow,
  revisionLocateLinks,
  sites,
  users,
} from '../db/schema/index.js';

/** What the list and status endpoints show: everything but the (large) snapshot. */
const summaryColumns = {
  id: packetRevisions.id,
  companyId: packetRevisions.companyId,
  jobId: packetRevisions.jobId,
  revision: packetRevisions.revision,
  status: packetRevisions.status,
  failureReason: packetRevisions.failureReason,
  attempts: packetRevisions.attempts,
  paperSize: packetRevisions.paperSize,
  pdfBytes: packetRevisions.pdfBytes,
  pdfSha256: packetRevisions.pdfSha256,
  pageCount: packetRevisions.pageCount,
  zipBytes: packetRevisions.zipBytes,
  zipSha256: packetRevisions.zipSha256,
  issuedByUserId: packetRevisions.issuedByUserId,
  issuedAt: packetRevisions.issuedAt,
  renderedAt: packetRevisions.renderedAt,
};

export type PacketRevisionSummary = Pick<PacketRevision, keyof typeof summaryColumns>;

export interface RenderedFiles {
  pdfKey: string;
  pdfBytes: number;
  pdfSha256: string;
  pageCount: number;
  zipKey: string;
  zipBytes: number;
  zipSha256: string;
}

/** Packet revisions, their signatures, and the company settings packets print with. */
@Injectable()
export class PacketsRepository {
  constructor(@Inject(DB) private readonly db: Db) {}

  /** The company's packet settings; the row is created with the defaults (letter, imperial) on first use. */
  async settings(companyId: string, tx?: Tx): Promise<CompanySettingsRow> {
    const db = tx ?? this.db;
    await db.insert(companySettings).values({ companyId }).onConflictDoNothing();
    const [row] = await db.select().from(companySettings).where(eq(companySettings.companyId, companyId));
    return row!;
  }

  async companyName(companyId: string, tx: Tx): Promise<string> {
    const [row] = await tx.select({ name: companies.name }).from(companies).where(eq(companies.id, companyId));
    return row?.name ?? '';
  }

  async userName(userId: string, tx: Tx): Promise<string | undefined> {
    const [row] = await tx.select({ name: users.name }).from(users).where(eq(users.id, userId));
    return row?.name;
  }

  /** The site's address and its customer, as printed on the cover. */
  async siteWithCustomer(siteId: string, tx: Tx) {
    const [row] = await tx
      .select({ site: sites, customer: { id: customers.id, name: customers.name, email: customers.email, phone: customers.phone } })
      .from(sites)
      .innerJoin(customers, eq(customers.id, sites.customerId))
      .where(eq(sites.id, siteId));
    return row;
  }

  async insert(revision: NewPacketRevision, tx: Tx): Promise<PacketRevisionSummary> {
    const [row] = await tx.insert(packetRevisions).values(revision).returning(summaryColumns);
    return row!;
  }

  async listByJob(companyId: string, jobId: string): Promise<PacketRevisionSummary[]> {
    return this.db
      .select(summaryColumns)
      .from(packetRevisions)
      .where(and(eq(packetRevisions.companyId, companyId), eq(packetRevisions.jobId, jobId)))
      .orderBy(desc(packetRevisions.revision));
  }

  async findSummary(companyId: string, id: string): Promise<PacketRevisionSummary | undefined> {
    const [row] = await this.db
      .select(summaryColumns)
      .from(packetRevisions)
      .where(and(eq(packetRevisions.companyId, companyId), eq(packetRevisions.id, id)));
    return row;
  }

  /** The full row (with snapshot and storage keys), whatever the company: for the render worker only. */
  async findForRender(id: string): Promise<PacketRevision | undefined> {
    const [row] = await this.db.select().from(packetRevisions).where(eq(packetRevisions.id, id));
    return row;
  }

  async findFiles(companyId: string, id: string) {
    const [row] = await this.db
      .select({
        ...summaryColumns,
        pdfKey: packetRevisions.pdfKey,
        zipKey: packetRevisions.zipKey,
        // The names frozen at issue, for the download's file name.
        siteLabel: sql<string | null>`${packetRevisions.snapshot}->'site'->>'label'`,
        jobTitle: sql<string | null>`${packetRevisions.snapshot}->'job'->>'title'`,
      })
      .from(packetRevisions)
      .where(and(eq(packetRevisions.companyId, companyId), eq(packetRevisions.id, id)));
    return row;
  }

  /** The locate URL the revision's QR code prints (made at issue); undefined for revisions issued before locate links. */
  async locateUrl(revisionId: string): Promise<string | undefined> {
    const [row] = await this.db.select({ url: revisionLocateLinks.url }).from(revisionLocateLinks).where(eq(revisionLocateLinks.revisionId, revisionId));
    return row?.url;
  }

  async signatures(revisionId: string): Promise<PacketSignatureRow[]> {
    return this.db.select().from(packetSignatures).where(eq(packetSignatures.revisionId, revisionId)).orderBy(asc(packetSignatures.role));
  }

  /**
   * Claims a revision for rendering: queued → rendering, counting the attempt. Exactly one of several
   * workers that picked up the same revision wins (the row update is atomic); a revision left in
   * `rendering` by a worker that died is claimable again once `staleAfterSeconds` have passed.
   */
  async claim(id: string, staleAfterSeconds: number): Promise<PacketRevision | undefined> {
    const [row] = await this.db
      .update(packetRevisions)
      .set({ status: 'rendering', attempts: sql`${packetRevisions.attempts} + 1`, updatedAt: sql`now()` })
      .where(
        and(
          eq(packetRevisions.id, id),
          or(
            eq(packetRevisions.status, 'queued'),
            and(
              eq(packetRevisions.status, 'rendering'),
              lt(packetRevisions.updatedAt, sql`now() - make_interval(secs => ${staleAfterSeconds})`),
            ),
          ),
        ),
      )
      .returning();
    return row;
  }

  async markReady(id: string, files: RenderedFiles): Promise<void> {
    await this.db
      .update(packetRevisions)
      .set({ ...files, status: 'ready', failureReason: null, renderedAt: sql`now()`, updatedAt: sql`now()` })
      .where(and(eq(packetRevisions.id, id), eq(packetRevisions.status, 'rendering')));
  }

  /** After a failed attempt: back to `queued` for a retry, or `failed` when no retry is left. */
  async markAttemptFailed(id: string, reason: string, isFinal: boolean): Promise<void> {
    await this.db
      .update(packetRevisions)
      .set({ status: isFinal ? 'failed' : 'queued', failureReason: reason.slice(0, 1000), updatedAt: sql`now()` })
      .where(and(eq(packetRevisions.id, id), eq(packetRevisions.status, 'rendering')));
  }

  /** Revisions still queued after `olderThanSeconds` (their queue message may have been lost). */
  async staleQueued(olderThanSeconds: number): Promise<{ id: string }[]> {
    return this.db
      .select({ id: packetRevisions.id })
      .from(packetRevisions)
      .where(
        and(
          inArray(packetRevisions.status, ['queued']),
          lt(packetRevisions.updatedAt, sql`now() - make_interval(secs => ${olderThanSeconds})`),
        ),
      )
      .limit(100);
  }
}
