import { Inject, Injectable } from '@nestjs/common';
import { and, asc, desc, eq, gt, inArray, isNull, lt, or, sql } from 'drizzle-orm';

import { DB, type Db, type Tx } from '../db/db.module.js';
import {
  companies,
  companySettings,
  invitationSites,
  invitations,
  jobs,
  type NewPacketDelivery,
  type PacketDelivery,
  packetDeliveries,
  packetRevisions,
  siteHomeowners,
  sites,
  users,
} from '../db/schema/index.js';

/** Packet deliveries and the recipients of a site. Company ids come from the signed-in user or a stored row. */
@Injectable()
export class DeliveryRepository {
  constructor(@Inject(DB) private readonly db: Db) {}

  transaction<T>(work: (tx: Tx) => Promise<T>): Promise<T> {
    return this.db.transaction(work);
  }

  /** The revision (without its snapshot) with its job's site, when it belongs to the company. */
  async revisionInCompany(companyId: string, revisionId: string) {
    const [row] = await this.db
      .select({ id: packetRevisions.id, status: packetRevisions.status, pdfBytes: packetRevisions.pdfBytes, jobId: jobs.id, siteId: jobs.siteId })
      .from(packetRevisions)
      .innerJoin(jobs, eq(jobs.id, packetRevisions.jobId))
      .where(and(eq(packetRevisions.companyId, companyId), eq(packetRevisions.id, revisionId)));
    return row;
  }

  async jobInCompany(companyId: string, jobId: string): Promise<boolean> {
    const [row] = await this.db.select({ id: jobs.id }).from(jobs).where(and(eq(jobs.companyId, companyId), eq(jobs.id, jobId)));
    return row !== undefined;
  }

  /** Homeowners linked to the site. */
  siteHomeowners(siteId: string, tx?: Tx) {
    return (tx ?? this.db)
      .select({ id: users.id, email: users.email, name: users.name })
      .from(siteHomeowners)
      .innerJoin(users, eq(users.id, siteHomeowners.userId))
      .where(and(eq(siteHomeowners.siteId, siteId), eq(users.isDisabled, false)))
      .orderBy(asc(users.email));
  }

  /** Open homeowner invitations that will link the site on acceptance. */
  openInvitationsForSite(siteId: string, tx?: Tx) {
    return (tx ?? this.db)
      .select({ id: invitations.id, email: invitations.email })
      .from(invitationSites)
      .innerJoin(invitations, eq(invitations.id, invitationSites.invitationId))
      .where(and(eq(invitationSites.siteId, siteId), isNull(invitations.acceptedAt), isNull(invitations.revokedAt), gt(invitations.expiresAt, sql`now()`)))
      .orderBy(asc(invitations.email));
  }

  /**
   * The account with this address in the company, if any. Only the actor's own company is looked at: an
   * address with an account elsewhere is treated as a new address (nothing tells the sender it exists).
   */
  async companyUserByEmail(companyId: string, email: string) {
    const [row] = await this.db
      .select({ id: users.id, role: users.role, isDisabled: users.isDisabled })
      .from(users)
      .where(and(eq(users.companyId, companyId), eq(users.email, email)));
    return row;
  }

  /** The company's invitation for this address that is neither accepted nor withdrawn (at most one; it may have expired). */
  async unusedInvitation(companyId: string, email: string, tx?: Tx) {
    const [row] = await (tx ?? this.db)
      .select({ id: invitations.id, role: invitations.role, isExpired: sql<boolean>`${invitations.expiresAt} <= now()` })
      .from(invitations)
      .where(and(eq(invitations.companyId, companyId), eq(invitations.email, email), isNull(invitations.acceptedAt), isNull(invitations.revokedAt)));
    return row;
  }

  async revokeInvitation(id: string, tx: Tx): Promise<void> {
    await tx.update(invitations).set({ revokedAt: sql`now()` }).where(and(eq(invitations.id, id), isNull(invitations.acceptedAt)));
  }

  /**
   * A homeowner invitation whose link the packet e-mail carries (no separate invitation e-mail). Its
   * token hash is of a token nobody keeps until the send worker arms it, as for queued account mail.
   */
  async insertHomeownerInvitation(
    row: { companyId: string; email: string; invitedByUserId: string; tokenHash: string; expiresAt: Date },
    tx: Tx,
  ): Promise<string> {
    const [inserted] = await tx
      .insert(invitations)
      .values({ ...row, role: 'homeowner', name: null })
      .returning({ id: invitations.id });
    return inserted!.id;
  }

  async addInvitationSite(invitationId: string, siteId: string, tx: Tx): Promise<void> {
    await tx.insert(invitationSites).values({ invitationId, siteId }).onConflictDoNothing();
  }

  /**
   * Gives an open invitation a new link token (its hash) that works for `ttlSeconds` from now; false when
   * it was accepted, withdrawn or has expired meanwhile (as OutgoingMailRepository.armInvitation does for
   * the invitation e-mail; the earlier link of the invitation stops working).
   */
  async armInvitation(invitationId: string, tokenHash: string, ttlSeconds: number): Promise<boolean> {
    const rows = await this.db
      .update(invitations)
      .set({ tokenHash, expiresAt: sql`now() + make_interval(secs => ${ttlSeconds})` })
      .where(and(eq(invitations.id, invitationId), isNull(invitations.acceptedAt), isNull(invitations.revokedAt), gt(invitations.expiresAt, sql`now()`)))
      .returning({ id: invitations.id });
    return rows.length === 1;
  }

  async linkHomeowner(siteId: string, userId: string, tx: Tx): Promise<void> {
    await tx.insert(siteHomeowners).values({ siteId, userId }).onConflictDoNothing();
  }

  async insertDeliveries(rows: NewPacketDelivery[], tx: Tx): Promise<PacketDelivery[]> {
    // Guard against an empty multi-row insert, which drizzle rejects.
    if (rows.length === 0) return [];
    return tx.insert(packetDeliveries).values(rows).returning();
  }

  listByRevision(companyId: string, revisionId: string): Promise<PacketDelivery[]> {
    return this.db
      .select()
      .from(packetDeliveries)
      .where(and(eq(packetDeliveries.companyId, companyId), eq(packetDeliveries.revisionId, revisionId)))
      .orderBy(desc(packetDeliveries.createdAt), asc(packetDeliveries.toAddress));
  }

  /** The company's deliveries of one job (every revision), with their revision, job and site; newest first. */
  listByJob(companyId: string, jobId: string) {
    return this.inContext().where(and(eq(packetDeliveries.companyId, companyId), eq(jobs.id, jobId))).orderBy(desc(packetDeliveries.createdAt), asc(packetDeliveries.toAddress));
  }

  /** The company's failed deliveries nobody has sent again or dismissed; newest first. */
  listOpenFailures(companyId: string) {
    return this.inContext()
      .where(and(eq(packetDeliveries.companyId, companyId), eq(packetDeliveries.status, 'failed'), isNull(packetDeliveries.dismissedAt)))
      .orderBy(desc(packetDeliveries.updatedAt))
      .limit(100);
  }

  private inContext() {
    return this.db
      .select({
        delivery: packetDeliveries,
        revision: packetRevisions.revision,
        jobId: jobs.id,
        jobTitle: jobs.title,
        siteId: sites.id,
        siteLabel: sites.label,
      })
      .from(packetDeliveries)
      .innerJoin(packetRevisions, eq(packetRevisions.id, packetDeliveries.revisionId))
      .innerJoin(jobs, eq(jobs.id, packetRevisions.jobId))
      .innerJoin(sites, eq(sites.id, jobs.siteId))
      .$dynamic();
  }

  /** One delivery of the company, locked for the caller's transaction. */
  async deliveryInCompanyForUpdate(companyId: string, id: string, tx: Tx): Promise<PacketDelivery | undefined> {
    const [row] = await tx
      .select()
      .from(packetDeliveries)
      .where(and(eq(packetDeliveries.companyId, companyId), eq(packetDeliveries.id, id)))
      .for('update');
    return row;
  }

  /** A failed delivery back to `queued` for another round of attempts (its last error stays until it is sent). */
  async requeueFailed(id: string, tx: Tx): Promise<PacketDelivery> {
    const [row] = await tx
      .update(packetDeliveries)
      .set({ status: 'queued', dismissedAt: null, dismissedByUserId: null, updatedAt: sql`now()` })
      .where(and(eq(packetDeliveries.id, id), eq(packetDeliveries.status, 'failed')))
      .returning();
    return row!;
  }

  async dismiss(id: string, userId: string, tx: Tx): Promise<PacketDelivery> {
    const [row] = await tx
      .update(packetDeliveries)
      .set({ dismissedAt: sql`now()`, dismissedByUserId: userId, updatedAt: sql`now()` })
      .where(eq(packetDeliveries.id, id))
      .returning();
    return row!;
  }

  /**
   * Claims a delivery for sending: queued → sending, counting the attempt. Only one of several workers
   * holding the same message wins; a delivery left `sending` by a worker that died is claimable again
   * after `staleAfterSeconds`.
   */
  async claim(id: string, staleAfterSeconds: number): Promise<PacketDelivery | undefined> {
    const [row] = await this.db
      .update(packetDeliveries)
      .set({ status: 'sending', attempts: sql`${packetDeliveries.attempts} + 1`, updatedAt: sql`now()` })
      .where(
        and(
          eq(packetDeliveries.id, id),
          or(
            eq(packetDeliveries.status, 'queued'),
            and(
              eq(packetDeliveries.status, 'sending'),
              lt(packetDeliveries.updatedAt, sql`now() - make_interval(secs => ${staleAfterSeconds})`),
            ),
          ),
        ),
      )
      .returning();
    return row;
  }

  async markSent(id: string, result: { messageId: string; isPdfAttached: boolean }): Promise<void> {
    await this.db
      .update(packetDeliveries)
      .set({ ...result, status: 'sent', lastError: null, sentAt: sql`now()`, updatedAt: sql`now()` })
      .where(and(eq(packetDeliveries.id, id), eq(packetDeliveries.status, 'sending')));
  }

  /** After a failed attempt: back to `queued` for a retry, or `failed` when no retry is left. */
  async markAttemptFailed(id: string, reason: string, isFinal: boolean): Promise<void> {
    await this.db
      .update(packetDeliveries)
      .set({ status: isFinal ? 'failed' : 'queued', lastError: reason.slice(0, 1000), updatedAt: sql`now()` })
      .where(and(eq(packetDeliveries.id, id), eq(packetDeliveries.status, 'sending')));
  }

  /** Deliveries still queued after `olderThanSeconds` with no attempt yet (their message may have been lost). */
  staleQueued(olderThanSeconds: number): Promise<{ id: string }[]> {
    return this.db
      .select({ id: packetDeliveries.id })
      .from(packetDeliveries)
      .where(
        and(
          inArray(packetDeliveries.status, ['queued']),
          eq(packetDeliveries.attempts, 0),
          lt(packetDeliveries.updatedAt, sql`now() - make_interval(secs => ${olderThanSeconds})`),
        ),
      )
      .limit(100);
  }

  /** What the e-mail says: the revision's figures and files, its job, site and company. */
  async mailContext(revisionId: string) {
    const [row] = await this.db
      .select({
        revision: {
          id: packetRevisions.id,
          companyId: packetRevisions.companyId,
          revision: packetRevisions.revision,
          status: packetRevisions.status,
          issuedAt: packetRevisions.issuedAt,
          pdfBytes: packetRevisions.pdfBytes,
          pdfSha256: packetRevisions.pdfSha256,
          zipSha256: packetRevisions.zipSha256,
          pageCount: packetRevisions.pageCount,
          summary: sql<{ runCount: number; itemCount: number; critical: number; warning: number } | null>`${packetRevisions.snapshot} -> 'analysis' -> 'summary'`,
        },
        jobTitle: jobs.title,
        site: { id: sites.id, label: sites.label, addressLine1: sites.addressLine1, city: sites.city },
        companyName: companies.name,
        companyEmail: companySettings.contactEmail,
        units: companySettings.units,
        // Dates as the packet prints them: the zone and locale frozen into the revision, else the company's now.
        timeZone: sql<string | null>`coalesce(${packetRevisions.snapshot} -> 'settings' ->> 'timeZone', ${companySettings.timeZone})`,
        locale: sql<string | null>`coalesce(${packetRevisions.snapshot} -> 'settings' ->> 'locale', ${companySettings.locale})`,
      })
      .from(packetRevisions)
      .innerJoin(jobs, eq(jobs.id, packetRevisions.jobId))
      .innerJoin(sites, eq(sites.id, jobs.siteId))
      .innerJoin(companies, eq(companies.id, packetRevisions.companyId))
      .leftJoin(companySettings, eq(companySettings.companyId, packetRevisions.companyId))
      .where(eq(packetRevisions.id, revisionId));
    return row;
  }

  async userName(email: string): Promise<string | null> {
    const [row] = await this.db.select({ name: users.name }).from(users).where(eq(users.email, email));
    return row?.name ?? null;
  }
}
