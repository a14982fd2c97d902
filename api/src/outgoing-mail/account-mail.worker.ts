import { Injectable, Logger } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';

import { hashToken, newOpaqueToken } from '../auth/tokens.js';
import { QueueWorker } from '../common/queue-worker.js';
import type { Env } from '../config/env.schema.js';
import type { OutgoingMailRow } from '../db/schema/index.js';
import { LinkBuilder } from '../mail/link-builder.js';
import type { MailTemplateName } from '../mail/mail-templates.js';
import { MailService } from '../mail/mail.service.js';
import { AccountMailQueue } from './account-mail-queue.js';
import { OutgoingMailRepository } from './outgoing-mail.repository.js';

const TEMPLATES: Record<OutgoingMailRow['kind'], MailTemplateName> = {
  invitation: 'invitation',
  password_reset: 'password-reset',
  signup_verification: 'signup-verification',
  signup_notice: 'signup-notice',
};

const WHAT: Record<OutgoingMailRow['kind'], string> = {
  invitation: 'invitation',
  password_reset: 'reset',
  signup_verification: 'sign-up',
  signup_notice: 'sign-up note',
};

/** A message left `sending` this long by a worker that died may be claimed again. */
const STALE_SEND_SECONDS = 10 * 60;
/** How often a running worker looks for committed messages whose queue message was lost. */
const SWEEP_INTERVAL_MS = 5 * 60_000;

/**
 * Sends queued invitation, password-reset and company sign-up e-mail, one claimed message at a time, with retries and
 * backoff by pg-boss (same pattern as PacketSendWorker).
 *
 * The link token is minted here, at send time, and only its hash is written to the invitation or reset
 * row. Why not store the token with the queued message: during an outage messages can wait for hours,
 * and a token at rest in clear would be a working account link for anyone who can read the table (or a
 * backup of it); encrypting it instead would need a key to manage and rotate. Minting late needs
 * neither. The cost: a retry after an SMTP server accepted a message whose acceptance we never recorded
 * mints a new link, so the earlier e-mail's link stops working and the later one's works.
 */
@Injectable()
export class AccountMailWorker extends QueueWorker {
  protected readonly logger = new Logger(AccountMailWorker.name);
  protected readonly workerName = 'account mail worker';
  private sweepTimer: NodeJS.Timeout | undefined;

  constructor(
    private readonly repository: OutgoingMailRepository,
    private readonly queue: AccountMailQueue,
    private readonly mail: MailService,
    private readonly links: LinkBuilder,
    private readonly config: ConfigService<Env, true>,
  ) {
    super();
  }

  /** Polls the queue, queues mail committed but never queued, and sweeps for such mail every few minutes. */
  protected async startWork(): Promise<void> {
    await this.queue.work(1, (job, meta) => this.send(job.mailId, meta.isFinalAttempt));
    await this.requeueStale();
  }

  protected override onStarted(): void {
    this.sweepTimer = setInterval(() => {
      this.requeueStale().catch((error: Error) => this.logger.warn(`account mail sweep failed: ${error.message}`));
    }, SWEEP_INTERVAL_MS);
    this.sweepTimer.unref();
  }

  protected override onStop(): void {
    clearInterval(this.sweepTimer);
  }

  async send(mailId: string, isFinalAttempt: boolean): Promise<void> {
    const mail = await this.repository.claim(mailId, STALE_SEND_SECONDS);
    if (!mail) {
      this.logger.debug(`account mail ${mailId} is not waiting to send (already claimed, done or cancelled)`);
      return;
    }
    try {
      const link = await this.mintLink(mail);
      if (!link) {
        await this.repository.markCancelled(mail.id, `the ${WHAT[mail.kind]} can no longer be used`);
        this.logger.log(`account mail ${mail.id} cancelled: its ${mail.kind} was used, withdrawn or expired before sending`);
        return;
      }
      const messageId = await this.mail.send({
        template: TEMPLATES[mail.kind],
        to: mail.toAddress,
        companyId: mail.companyId,
        data: { ...mail.data, ...link },
      });
      await this.repository.markSent(mail.id, messageId);
    } catch (error) {
      const reason = error instanceof Error ? error.message : String(error);
      await this.repository.markAttemptFailed(mail.id, reason, isFinalAttempt);
      this.logger.error(`account mail ${mail.id} (${mail.kind}) failed${isFinalAttempt ? '' : ' (will retry)'}: ${reason}`);
      throw error;
    }
  }

  /** A fresh single-use link for the message's invitation or reset, or undefined when it can no longer be used. */
  private async mintLink(mail: OutgoingMailRow): Promise<Record<string, string | number> | undefined> {
    // A note to an account holder whose address was used for a sign-up carries no single-use link.
    if (mail.kind === 'signup_notice') return { signInLink: this.links.to('/sign-in') };
    const token = newOpaqueToken();
    if (mail.kind === 'signup_verification') {
      const hours = this.config.get('SIGNUP_TTL_HOURS', { infer: true });
      if (!(await this.repository.armSignup(mail.signupId!, hashToken(token), hours * 3600))) return undefined;
      return { link: this.links.to('/sign-up/verify', { token }), hours };
    }
    if (mail.kind === 'invitation') {
      const hours = this.config.get('INVITATION_TTL_HOURS', { infer: true });
      if (!(await this.repository.armInvitation(mail.invitationId!, hashToken(token), hours * 3600))) return undefined;
      return { link: this.links.to('/accept-invitation', { token }), hours };
    }
    const minutes = this.config.get('PASSWORD_RESET_TTL_MINUTES', { infer: true });
    if (!(await this.repository.armPasswordReset(mail.passwordResetId!, hashToken(token), minutes * 60))) return undefined;
    return { link: this.links.to('/reset-password', { token }), minutes };
  }

  /** Re-queues committed messages that never reached the queue (the process stopped in between). */
  private async requeueStale(): Promise<void> {
    // A duplicate queue message is harmless: sending starts with an exclusive claim.
    for (const { id } of await this.repository.staleQueued(120)) await this.queue.enqueue({ mailId: id });
  }
}
