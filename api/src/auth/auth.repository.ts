import { Inject, Injectable } from '@nestjs/common';
import { and, eq, gt, isNull, sql } from 'drizzle-orm';

import { DB, type Db, type Tx } from '../db/db.module.js';
import {
  companies,
  invitationSites,
  invitations,
  passwordResetTokens,
  refreshSessions,
  type NewUser,
  type RefreshSession,
  type User,
  users,
} from '../db/schema/index.js';

export type UserWithCompany = User & { companyName: string };

/** The account behind an access token, read on every signed-in request: built once as a named prepared statement. */
function userByIdQuery(db: Db) {
  return db
    .select({ user: users, companyName: companies.name })
    .from(users)
    .innerJoin(companies, eq(companies.id, users.companyId))
    .where(eq(users.id, sql.placeholder('id')))
    .prepare('auth_user_by_id');
}

@Injectable()
export class AuthRepository {
  private readonly userById: ReturnType<typeof userByIdQuery>;

  constructor(@Inject(DB) private readonly db: Db) {
    this.userById = userByIdQuery(db);
  }

  async findUserByEmail(email: string): Promise<UserWithCompany | undefined> {
    const [row] = await this.db
      .select({ user: users, companyName: companies.name })
      .from(users)
      .innerJoin(companies, eq(companies.id, users.companyId))
      .where(eq(users.email, email));
    return row && { ...row.user, companyName: row.companyName };
  }

  async findUserById(id: string): Promise<UserWithCompany | undefined> {
    const [row] = await this.userById.execute({ id });
    return row && { ...row.user, companyName: row.companyName };
  }

  async insertUser(user: NewUser, tx: Tx): Promise<User> {
    const [row] = await tx.insert(users).values(user).returning();
    return row!;
  }

  async touchLastSignIn(userId: string): Promise<void> {
    await this.db.update(users).set({ lastSignInAt: new Date() }).where(eq(users.id, userId));
  }

  async setPassword(userId: string, passwordHash: string, tx: Tx): Promise<void> {
    await tx.update(users).set({ passwordHash, updatedAt: new Date() }).where(eq(users.id, userId));
  }

  async insertRefreshSession(
    session: Pick<RefreshSession, 'userId' | 'familyId' | 'tokenHash' | 'expiresAt' | 'userAgent' | 'ip'>,
    tx?: Tx,
  ): Promise<void> {
    await (tx ?? this.db).insert(refreshSessions).values(session);
  }

  async findRefreshSession(tokenHash: string): Promise<RefreshSession | undefined> {
    const [row] = await this.db.select().from(refreshSessions).where(eq(refreshSessions.tokenHash, tokenHash));
    return row;
  }

  /**
   * Marks a live token as used, atomically: returns false when another request already rotated it,
   * which the caller treats as reuse.
   */
  async claimRefreshSession(id: string, tx: Tx): Promise<boolean> {
    const rows = await tx
      .update(refreshSessions)
      .set({ replacedAt: new Date() })
      .where(and(eq(refreshSessions.id, id), isNull(refreshSessions.replacedAt), isNull(refreshSessions.revokedAt)))
      .returning({ id: refreshSessions.id });
    return rows.length === 1;
  }

  async revokeFamily(familyId: string, tx?: Tx): Promise<void> {
    await (tx ?? this.db)
      .update(refreshSessions)
      .set({ revokedAt: new Date() })
      .where(and(eq(refreshSessions.familyId, familyId), isNull(refreshSessions.revokedAt)));
  }

  async revokeAllForUser(userId: string, tx?: Tx): Promise<void> {
    await (tx ?? this.db)
      .update(refreshSessions)
      .set({ revokedAt: new Date() })
      .where(and(eq(refreshSessions.userId, userId), isNull(refreshSessions.revokedAt)));
  }

  async insertPasswordReset(userId: string, tokenHash: string, expiresAt: Date, tx: Tx): Promise<string> {
    const [row] = await tx.insert(passwordResetTokens).values({ userId, tokenHash, expiresAt }).returning({ id: passwordResetTokens.id });
    return row!.id;
  }

  /** Consumes an unexpired, unused reset token; returns its user id, or undefined. Single use. */
  async consumePasswordReset(tokenHash: string, tx: Tx): Promise<string | undefined> {
    const [row] = await tx
      .update(passwordResetTokens)
      .set({ usedAt: new Date() })
      .where(
        and(
          eq(passwordResetTokens.tokenHash, tokenHash),
          isNull(passwordResetTokens.usedAt),
          gt(passwordResetTokens.expiresAt, new Date()),
        ),
      )
      .returning({ userId: passwordResetTokens.userId });
    return row?.userId;
  }

  /** An invitation that can still be accepted (not accepted, revoked or expired), with its company. */
  async findOpenInvitation(tokenHash: string) {
    const [row] = await this.db
      .select({ invitation: invitations, companyName: companies.name })
      .from(invitations)
      .innerJoin(companies, eq(companies.id, invitations.companyId))
      .where(
        and(
          eq(invitations.tokenHash, tokenHash),
          isNull(invitations.acceptedAt),
          isNull(invitations.revokedAt),
          gt(invitations.expiresAt, new Date()),
        ),
      );
    return row && { ...row.invitation, companyName: row.companyName };
  }

  /** Marks an open invitation accepted; false when it was used (or revoked) in the meantime. */
  async claimInvitation(id: string, tx: Tx): Promise<boolean> {
    const rows = await tx
      .update(invitations)
      .set({ acceptedAt: new Date() })
      .where(and(eq(invitations.id, id), isNull(invitations.acceptedAt), isNull(invitations.revokedAt)))
      .returning({ id: invitations.id });
    return rows.length === 1;
  }

  /** Links a new homeowner to the sites their invitation named (a packet sent to them invited them). */
  async linkInvitedSites(invitationId: string, userId: string, tx: Tx): Promise<void> {
    await tx.execute(
      sql`insert into site_homeowners (site_id, user_id)
          select ${invitationSites.siteId}, ${userId} from ${invitationSites} where ${invitationSites.invitationId} = ${invitationId}
          on conflict do nothing`,
    );
  }

  transaction<T>(work: (tx: Tx) => Promise<T>): Promise<T> {
    return this.db.transaction(work);
  }
}
