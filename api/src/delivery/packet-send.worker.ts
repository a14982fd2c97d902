import { Injectable, Logger } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';

import { QueueWorker } from '../common/queue-worker.js';
import type { Env } from '../config/env.schema.js';
import { locateCautions } from '../domain/locate/locate-cautions.js';
import { formatDate } from '../domain/packet/packet-format.js';
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
 * through MailService with the PDF attached when it is at most MAIL_MAX_ATTACHMENT_BYTES (a link to the
 * portal otherwise). A failed attempt goes back to `queued` with its error and pg-boss retries it with
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
      const isPdfAttached = (revision.pdfBytes ?? Number.POSITIVE_INFINITY) <= maxBytes;
      const attachments = [];
      if (isPdfAttached) {
        const file = await this.packets.fileInCompany(revision.companyId, revision.id, 'pdf');
        attachments.push({ filename: file.fileName, content: file.body, contentType: file.contentType });
      }
      const summary = revision.summary;
      const messageId = await this.mail.send({
        template: 'packet-sent',
        to: delivery.toAddress,
        cc: delivery.ccAddresses.length > 0 ? delivery.ccAddresses : undefined,
        companyId: revision.companyId,
        attachments,
        data: {
          name: await this.repository.userName(delivery.toAddress),
          companyName: context.companyName,
          siteLabel: site.label,
          siteAddress: `${site.addressLine1}, ${site.city}`,
          jobTitle: context.jobTitle,
          revision: revision.revision,
          issuedDate: formatDate(revision.issuedAt.toISOString()),
          pageCount: revision.pageCount ?? 0,
          runCount: summary?.runCount ?? 0,
          itemCount: summary?.itemCount ?? 0,
          findingCount: (summary?.critical ?? 0) + (summary?.warning ?? 0),
          hasFindings: (summary?.critical ?? 0) + (summary?.warning ?? 0) > 0,
          message: delivery.message,
          isPdfAttached,
          pdfSize: megabytes(revision.pdfBytes ?? 0),
          pdfSha256: revision.pdfSha256,
          portalLink: this.links.to(`/portal/sites/${site.id}`),
          isInvited: delivery.invitationId !== null,
          cautionSummary: locateCautions(context.units ?? 'imperial').summary.replace('this map', 'the packet’s map'),
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
}
