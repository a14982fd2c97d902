import { Inject, Injectable } from '@nestjs/common';
import { and, asc, count, eq, gt, isNull } from 'drizzle-orm';

import { DB, type Db, type Tx } from '../db/db.module.js';
import { companies, invitationSites, invitations, type NewUser, refreshSessions, type User, users } from '../db/schema/index.js';
import { afterCursor } from '../db/keyset.js';
import { type CursorPageQuery, cursorLimit, cursorPageOffset } from '../domain/paging/page.schema.js';

/** Every method takes the company id from the signed-in user: nothing here crosses companies. */
@Injectable()
export class UsersRepository {
  constructor(@Inject(DB) private readonly db: Db) {}

  /** One page of the company's people by name (with one row more, to tell whether another follows), and how many there are in all. */
  async listByCompany(companyId: string, page: CursorPageQuery): Promise<{ rows: User[]; total: number }> {
    const [rows, [counted]] = await Promise.all([
      this.db
        .select()
        .from(users)
        .where(and(eq(users.companyId, companyId), afterCursor(users.name, users.id, page.cursor)))
        .orderBy(asc(users.name), asc(users.id))
        .limit(cursorLimit(page))
        .offset(cursorPageOffset(page)),
      this.db.select({ n: count() }).from(users).where(eq(users.companyId, companyId)),
    ]);
    return { rows, total: counted?.n ?? 0 };
  }

  async findInCompany(companyId: string, id: string): Promise<User | undefined> {
    const [row] = await this.db.select().from(users).where(and(eq(users.companyId, companyId), eq(users.id, id)));
    return row;
  }

  async updateInCompany(companyId: string, id: string, patch: Partial<NewUser>, tx: Tx): Promise<User | undefined> {
    const [row] = await tx
      .update(users)
      .set({ ...patch, updatedAt: new Date() })
      .where(and(eq(users.companyId, companyId), eq(users.id, id)))
      .returning();
    return row;
  }

  async companyName(companyId: string): Promise<string> {
    const [row] = await this.db.select({ name: companies.name }).from(companies).where(eq(companies.id, companyId));
    return row?.name ?? '';
  }

  /** Whether the address has an account in this company (accounts elsewhere are not this company's business). */
  async emailExistsInCompany(companyId: string, email: string): Promise<boolean> {
    const [row] = await this.db
      .select({ id: users.id })
      .from(users)
      .where(and(eq(users.companyId, companyId), eq(users.email, email)));
    return row !== undefined;
  }

  /** Ends every session of the user (all refresh token families). */
  async revokeSessionsOf(userId: string, tx: Tx): Promise<void> {
    await tx
      .update(refreshSessions)
      .set({ revokedAt: new Date() })
      .where(and(eq(refreshSessions.userId, userId), isNull(refreshSessions.revokedAt)));
  }

  listOpenInvitations(companyId: string) {
    return this.db
      .select()
      .from(invitations)
      .where(
        and(
          eq(invitations.companyId, companyId),
          isNull(invitations.acceptedAt),
          isNull(invitations.revokedAt),
          gt(invitations.expiresAt, new Date()),
        ),
      )
      .orderBy(asc(invitations.createdAt));
  }

  async findOpenInvitationInCompany(companyId: string, id: string) {
    const [row] = await this.db
      .select()
      .from(invitations)
      .where(
        and(
          eq(invitations.companyId, companyId),
          eq(invitations.id, id),
          isNull(invitations.acceptedAt),
          isNull(invitations.revokedAt),
          gt(invitations.expiresAt, new Date()),
        ),
      );
    return row;
  }

  /** This company's open (not accepted, not revoked) invitations for the address, locked for the caller's transaction. */
  openInvitationsFor(companyId: string, email: string, tx: Tx) {
    return tx
      .select()
      .from(invitations)
      .where(
        and(
          eq(invitations.companyId, companyId),
          eq(invitations.email, email),
          isNull(invitations.acceptedAt),
          isNull(invitations.revokedAt),
        ),
      )
      .for('update');
  }

  /** Revokes this company's open invitation for the address (a new one replaces it); other companies' stay. */
  async revokeOpenInvitationsFor(companyId: string, email: string, tx: Tx): Promise<void> {
    await tx
      .update(invitations)
      .set({ revokedAt: new Date() })
      .where(
        and(
          eq(invitations.companyId, companyId),
          eq(invitations.email, email),
          isNull(invitations.acceptedAt),
          isNull(invitations.revokedAt),
        ),
      );
  }

  async insertInvitation(invitation: typeof invitations.$inferInsert, tx: Tx) {
    const [row] = await tx.insert(invitations).values(invitation).returning();
    return row!;
  }

  /** Sites a homeowner invitation links on acceptance. */
  async insertInvitationSites(invitationId: string, siteIds: readonly string[], tx: Tx): Promise<void> {
    // Guard against an empty multi-row insert, which drizzle rejects.
    if (siteIds.length === 0) return;
    await tx.insert(invitationSites).values(siteIds.map((siteId) => ({ invitationId, siteId }))).onConflictDoNothing();
  }

  async revokeInvitationInCompany(companyId: string, id: string, tx: Tx) {
    const [row] = await tx
      .update(invitations)
      .set({ revokedAt: new Date() })
      .where(
        and(eq(invitations.companyId, companyId), eq(invitations.id, id), isNull(invitations.acceptedAt), isNull(invitations.revokedAt)),
      )
      .returning();
    return row;
  }

  transaction<T>(work: (tx: Tx) => Promise<T>): Promise<T> {
    return this.db.transaction(work);
  }
}
