import { Injectable, Logger } from '@nestjs/common';

import { hashToken, newOpaqueToken } from '../auth/tokens.js';
import type { Tx } from '../db/db.module.js';
import type { OutgoingMailRow } from '../db/schema/index.js';
import { AccountMailQueue } from './account-mail-queue.js';
import { OutgoingMailRepository } from './outgoing-mail.repository.js';

/** What the invitation e-mail says besides its link (templates/mail/invitation). */
export interface InvitationMailData {
  name: string | null;
  inviterName: string;
  companyName: string;
  roleLabel: string;
  isHomeowner: boolean;
}

/** What the password-reset e-mail says besides its link (templates/mail/password-reset). */
export interface PasswordResetMailData {
  name: string;
  companyName: string;
}

/**
 * Account e-mail goes through a queue, never from the request: the caller records the message in the
 * transaction that creates its invitation or reset, and after commit hands it to the account-mail
 * worker. An SMTP outage therefore delays the message (retries with backoff) without losing it or
 * failing the request.
 */
@Injectable()
export class OutgoingMailService {
  private readonly logger = new Logger(OutgoingMailService.name);

  constructor(
    private readonly repository: OutgoingMailRepository,
    private readonly queue: AccountMailQueue,
  ) {}

  /**
   * The token hash to store on a new invitation or reset row: the hash of a token nobody keeps, so the
   * row cannot be used until the worker mints the real link at send time.
   */
  sealedTokenHash(): string {
    return hashToken(newOpaqueToken());
  }

  queueInvitation(
    tx: Tx,
    mail: { companyId: string; invitationId: string; to: string; data: InvitationMailData },
  ): Promise<OutgoingMailRow> {
    return this.repository.insert(
      { companyId: mail.companyId, kind: 'invitation', toAddress: mail.to, invitationId: mail.invitationId, data: { ...mail.data } },
      tx,
    );
  }

  queuePasswordReset(
    tx: Tx,
    mail: { companyId: string; passwordResetId: string; to: string; data: PasswordResetMailData },
  ): Promise<OutgoingMailRow> {
    return this.repository.insert(
      { companyId: mail.companyId, kind: 'password_reset', toAddress: mail.to, passwordResetId: mail.passwordResetId, data: { ...mail.data } },
      tx,
    );
  }

  /** The verification link of a company sign-up (no company yet); `receiptHash` lets the sign-up page find it. */
  queueSignupVerification(
    tx: Tx,
    mail: { signupId: string; to: string; receiptHash: string; data: { name: string; companyName: string } },
  ): Promise<OutgoingMailRow> {
    return this.repository.insert(
      { companyId: null, kind: 'signup_verification', toAddress: mail.to, signupId: mail.signupId, receiptHash: mail.receiptHash, data: { ...mail.data } },
      tx,
    );
  }

  /** A note to the holder of an existing account whose address someone used to sign up a company. */
  queueSignupNotice(
    tx: Tx,
    mail: { companyId: string; to: string; receiptHash: string; data: { name: string; companyName: string } },
  ): Promise<OutgoingMailRow> {
    return this.repository.insert(
      { companyId: mail.companyId, kind: 'signup_notice', toAddress: mail.to, receiptHash: mail.receiptHash, data: { ...mail.data } },
      tx,
    );
  }

  /** Cancels an invitation's messages still waiting, when a newer one is about to be queued. */
  cancelWaitingForInvitation(tx: Tx, invitationId: string): Promise<void> {
    return this.repository.cancelWaitingForInvitation(invitationId, tx);
  }

  /** Hands committed messages to the worker. Never throws: a message not queued now is re-queued by a starting worker. */
  async dispatch(mailId: string): Promise<void> {
    await this.queue.enqueue({ mailId }).catch((error: unknown) => {
      this.logger.error(`account mail ${mailId} recorded but not queued: ${error instanceof Error ? error.message : String(error)}`);
    });
  }

  /** The newest message of each invitation, by invitation id. */
  async latestForInvitations(invitationIds: readonly string[]): Promise<Map<string, OutgoingMailRow>> {
    const rows = await this.repository.latestForInvitations(invitationIds);
    return new Map(rows.map((row) => [row.invitationId!, row]));
  }
}
