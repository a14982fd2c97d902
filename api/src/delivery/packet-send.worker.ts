import { Injectable, Logger } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';

import { hashToken, newOpaqueToken } from '../auth/tokens.js';
import { QueueWorker } from '../common/queue-worker.js';
import type { Env } from '../config/env.schema.js';
import { locateCautions } from '../domain/locate/locate-cautions.js';
import { formatDate } from '../domain/format/date-time.js';
import { LinkBuilder } from '../mail/link-builder.js';
import { MailService } from '../mail/mail.service.js';
import { PacketsService } from '../packets/packets.service.js';
import { DeliveryQueue } from './delivery-queue.js';
import { DeliveryRepository } from './delivery.repository.js';

/** A delivery left `sending` this long by a worker that died may be claimed again. */
const STALE_SEND_SECONDS = 10 * 60;

function megabytes(bytes: number): string {
  return `${(bytes / 1_048_576).toFixed(1)} MB`;
}

/**
 * Sends queued packet e-mails: claims the delivery, renders `templates/mail/packet-sent/` and sends it
 * through MailService with the PDF attached when the sender chose so and it is at most
 * MAIL_MAX_ATTACHMENT_BYTES (a link to the portal otherwise), and the link of the recipient's portal
 * invitation when they have no account yet. A failed attempt goes back to `queued` with its error and pg-boss retries it with
 * backoff; the last failure marks the delivery `failed`. Same start-up pattern as the render worker.
 */
@Injectable()
export class PacketSendWorker extends QueueWorker {
  protected readonly logger = new Logger(PacketSendWorker.name);
  protected readonly workerName = 'packet send worker';

  constructor(
    private readonly repository: DeliveryRepository,
    private readonly queue: DeliveryQueue,
    private readonly packets: PacketsService,
    private readonly mail: MailService,
    private readonly links: LinkBuilder,
    private readonly config: ConfigService<Env, true>,
  ) {
    super();
  }

  /** Polls the send queue, and queues deliveries committed but never queued (the process stopped in between). */
  protected async startWork(): Promise<void> {
    await this.queue.work(1, (job, meta) => this.send(job.deliveryId, meta.isFinalAttempt));
    // A duplicate message is harmless because sending starts with an exclusive claim.
    for (const { id } of await this.repository.staleQueued(120)) await this.queue.enqueue({ deliveryId: id });
  }

  async send(deliveryId: string, isFinalAttempt: boolean): Promise<void> {
    const delivery = await this.repository.claim(deliveryId, STALE_SEND_SECONDS);
    if (!delivery) {
      this.logger.debug(`delivery ${deliveryId} is not waiting to send (already claimed or done)`);
      return;
    }
    try {
      const context = await this.repository.mailContext(delivery.revisionId);
      if (!context || context.revision.status !== 'ready' || !context.revision.pdfSha256) throw new Error('the packet revision is not ready');
      const { revision, site } = context;
      const maxBytes = this.config.get('MAIL_MAX_ATTACHMENT_BYTES', { infer: true });
      const isPdfAttached = delivery.wantsPdfAttached && (revision.pdfBytes ?? Number.POSITIVE_INFINITY) <= maxBytes;
      const attachments = [];
      if (isPdfAttached) {
        const file = await this.packets.fileInCompany(revision.companyId, revision.id, 'pdf');
        attachments.push({ filename: file.fileName, content: file.body, contentType: file.contentType });
      }
      const summary = revision.summary;
      const invitation = delivery.invitationId ? await this.invitationLink(delivery.invitationId) : undefined;
      const messageId = await this.mail.send({
        template: 'packet-sent',
        to: delivery.toAddress,
        cc: delivery.ccAddresses.length > 0 ? delivery.ccAddresses : undefined,
        companyId: revision.companyId,
        // The homeowner sees the company as the sender, and a reply reaches its e-mail (company profile).
        sender: { name: context.companyName, replyTo: context.companyEmail ?? null },
        attachments,
        data: {
          name: await this.repository.userName(delivery.toAddress),
          companyName: context.companyName,
          siteLabel: site.label,
          siteAddress: `${site.addressLine1}, ${site.city}`,
          jobTitle: context.jobTitle,
          revision: revision.revision,
          issuedDate: formatDate(revision.issuedAt, { timeZone: context.timeZone, locale: context.locale }),
          pageCount: revision.pageCount ?? 0,
          runCount: summary?.runCount ?? 0,
          itemCount: summary?.itemCount ?? 0,
          findingCount: (summary?.critical ?? 0) + (summary?.warning ?? 0),
          hasFindings: (summary?.critical ?? 0) + (summary?.warning ?? 0) > 0,
          message: delivery.message,
          isPdfAttached,
          isLinkChosen: !delivery.wantsPdfAttached,
          pdfSize: megabytes(revision.pdfBytes ?? 0),
          pdfSha256: revision.pdfSha256,
          portalLink: this.links.to(`/portal/sites/${site.id}`),
          isInvited: invitation !== undefined,
          invitationLink: invitation?.link ?? null,
          invitationHours: invitation?.hours ?? null,
          cautionSummary: locateCautions(context.units ?? 'imperial', context.locale).summary.replace('this map', 'the packet’s map'),
        },
      });
      await this.repository.markSent(delivery.id, { messageId, isPdfAttached });
      this.logger.log(`delivery ${delivery.id} of packet ${revision.id} sent (${isPdfAttached ? 'PDF attached' : 'link only'})`);
    } catch (error) {
      const reason = error instanceof Error ? error.message : String(error);
      await this.repository.markAttemptFailed(delivery.id, reason, isFinalAttempt);
      this.logger.error(`delivery ${delivery.id} failed${isFinalAttempt ? '' : ' (will retry)'}: ${reason}`);
      throw error;
    }
  }

  /**
   * A fresh link for the homeowner invitation this e-mail carries (minted at send time, as the account
   * mail worker does, so no working token waits in a table); undefined once the invitation was accepted,
   * withdrawn or has expired — the recipient then has an account or needs a new invitation.
   */
  private async invitationLink(invitationId: string): Promise<{ link: string; hours: number } | undefined> {
    const token = newOpaqueToken();
    const hours = this.config.get('INVITATION_TTL_HOURS', { infer: true });
    if (!(await this.repository.armInvitation(invitationId, hashToken(token), hours * 3600))) return undefined;
    return { link: this.links.to('/accept-invitation', { token }), hours };
  }
}
