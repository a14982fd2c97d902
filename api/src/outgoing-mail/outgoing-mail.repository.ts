import { Inject, Injectable } from '@nestjs/common';
import { and, desc, eq, gt, inArray, isNull, lt, or, sql } from 'drizzle-orm';

import { DB, type Db, type Tx } from '../db/db.module.js';
import { companySignups, invitations, type NewOutgoingMailRow, type OutgoingMailRow, outgoingMail, passwordResetTokens } from '../db/schema/index.js';

@Injectable()
export class OutgoingMailRepository {
  constructor(@Inject(DB) private readonly db: Db) {}

  async insert(row: NewOutgoingMailRow, tx: Tx): Promise<OutgoingMailRow> {
    const [inserted] = await tx.insert(outgoingMail).values(row).returning();
    return inserted!;
  }

  /**
   * Claims a message for sending: queued → sending, counting the attempt. Only one of several workers
   * holding the same queue message wins; a message left `sending` by a worker that died is claimable
   * again after `staleAfterSeconds`.
   */
  async claim(id: string, staleAfterSeconds: number): Promise<OutgoingMailRow | undefined> {
    const [row] = await this.db
      .update(outgoingMail)
      .set({ status: 'sending', attempts: sql`${outgoingMail.attempts} + 1`, updatedAt: sql`now()` })
      .where(
        and(
          eq(outgoingMail.id, id),
          or(
            eq(outgoingMail.status, 'queued'),
            and(eq(outgoingMail.status, 'sending'), lt(outgoingMail.updatedAt, sql`now() - make_interval(secs => ${staleAfterSeconds})`)),
          ),
        ),
      )
      .returning();
    return row;
  }

  /**
   * Gives an open invitation a new link token (its hash) that works for `ttlSeconds` from now. False
   * when the invitation was accepted, revoked or has expired meanwhile: there is nothing to send.
   */
  async armInvitation(invitationId: string, tokenHash: string, ttlSeconds: number): Promise<boolean> {
    const rows = await this.db
      .update(invitations)
      .set({ tokenHash, expiresAt: sql`now() + make_interval(secs => ${ttlSeconds})` })
      .where(
        and(eq(invitations.id, invitationId), isNull(invitations.acceptedAt), isNull(invitations.revokedAt), gt(invitations.expiresAt, sql`now()`)),
      )
      .returning({ id: invitations.id });
    return rows.length === 1;
  }

  /** The same for an open (not completed, not superseded), unexpired company sign-up. */
  async armSignup(signupId: string, tokenHash: string, ttlSeconds: number): Promise<boolean> {
    const rows = await this.db
      .update(companySignups)
      .set({ tokenHash, expiresAt: sql`now() + make_interval(secs => ${ttlSeconds})` })
      .where(
        and(
          eq(companySignups.id, signupId),
          isNull(companySignups.completedAt),
          isNull(companySignups.supersededAt),
          gt(companySignups.expiresAt, sql`now()`),
        ),
      )
      .returning({ id: companySignups.id });
    return rows.length === 1;
  }

  /** The same for an unused, unexpired password reset. */
  async armPasswordReset(resetId: string, tokenHash: string, ttlSeconds: number): Promise<boolean> {
    const rows = await this.db
      .update(passwordResetTokens)
      .set({ tokenHash, expiresAt: sql`now() + make_interval(secs => ${ttlSeconds})` })
      .where(and(eq(passwordResetTokens.id, resetId), isNull(passwordResetTokens.usedAt), gt(passwordResetTokens.expiresAt, sql`now()`)))
      .returning({ id: passwordResetTokens.id });
    return rows.length === 1;
  }

  async markSent(id: string, messageId: string): Promise<void> {
    await this.db
      .update(outgoingMail)
      .set({ status: 'sent', messageId, lastError: null, sentAt: sql`now()`, updatedAt: sql`now()` })
      .where(and(eq(outgoingMail.id, id), eq(outgoingMail.status, 'sending')));
  }

  /** After a failed attempt: back to `queued` for a retry, or `failed` when no retry is left. */
  async markAttemptFailed(id: string, reason: string, isFinal: boolean): Promise<void> {
    await this.db
      .update(outgoingMail)
      .set({ status: isFinal ? 'failed' : 'queued', lastError: reason.slice(0, 1000), updatedAt: sql`now()` })
      .where(and(eq(outgoingMail.id, id), eq(outgoingMail.status, 'sending')));
  }

  async markCancelled(id: string, reason: string): Promise<void> {
    await this.db
      .update(outgoingMail)
      .set({ status: 'cancelled', lastError: reason, updatedAt: sql`now()` })
      .where(and(eq(outgoingMail.id, id), eq(outgoingMail.status, 'sending')));
  }

  /** Cancels an invitation's messages that no worker has picked up yet (a newer one replaces them). */
  async cancelWaitingForInvitation(invitationId: string, tx: Tx): Promise<void> {
    await tx
      .update(outgoingMail)
      .set({ status: 'cancelled', lastError: 'replaced by a newer message', updatedAt: sql`now()` })
      .where(and(eq(outgoingMail.invitationId, invitationId), eq(outgoingMail.status, 'queued')));
  }

  /** Messages still queued after `olderThanSeconds` with no attempt yet (their queue message may have been lost). */
  staleQueued(olderThanSeconds: number): Promise<{ id: string }[]> {
    return this.db
      .select({ id: outgoingMail.id })
      .from(outgoingMail)
      .where(
        and(
          eq(outgoingMail.status, 'queued'),
          eq(outgoingMail.attempts, 0),
          lt(outgoingMail.updatedAt, sql`now() - make_interval(secs => ${olderThanSeconds})`),
        ),
      )
      .limit(100);
  }

  /** The newest message of each invitation. */
  async latestForInvitations(invitationIds: readonly string[]): Promise<OutgoingMailRow[]> {
    // Guard against running an invalid query when ids is empty.
    if (invitationIds.length === 0) return [];
    return this.db
      .selectDistinctOn([outgoingMail.invitationId])
      .from(outgoingMail)
      .where(inArray(outgoingMail.invitationId, [...invitationIds]))
      .orderBy(outgoingMail.invitationId, desc(outgoingMail.createdAt));
  }
}
