import { Injectable, Logger } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';

import { AuditService } from '../audit/audit.service.js';
import { hashToken, newOpaqueToken } from '../auth/tokens.js';
import type { AuthUser } from '../common/decorators/current-user.decorator.js';
import type { Env } from '../config/env.schema.js';
import type { Tx } from '../db/db.module.js';
import type { PacketDelivery } from '../db/schema/index.js';
import { ConflictError, findOrFail, NotFoundError, RuleViolationError } from '../domain/errors.js';
import { canInvite } from '../domain/auth/roles.js';
import { plainDeliveryFailure } from '../domain/delivery/delivery-failure.js';
import type {
  DeliveryInContext,
  PacketDeliveryResponse,
  SendOptionsResponse,
  SendPacketParsed,
  SendPacketResponse,
} from '../domain/delivery/delivery.schema.js';
import { jobNotFound } from '../jobs/job-errors.js';
import { packetNotFound } from '../packets/packet-errors.js';
import { DeliveryQueue } from './delivery-queue.js';
import { DeliveryRepository } from './delivery.repository.js';

export function toDeliveryResponse(row: PacketDelivery): PacketDeliveryResponse {
  return {
    id: row.id,
    revisionId: row.revisionId,
    to: row.toAddress,
    cc: row.ccAddresses,
    message: row.message,
    status: row.status,
    attempts: row.attempts,
    lastError: row.lastError,
    failureReason: plainDeliveryFailure(row.lastError),
    pdf: row.wantsPdfAttached ? 'attached' : 'link',
    isPdfAttached: row.isPdfAttached,
    messageId: row.messageId,
    isInvited: row.invitationId !== null,
    requestedByUserId: row.requestedByUserId,
    createdAt: row.createdAt.toISOString(),
    updatedAt: row.updatedAt.toISOString(),
    sentAt: row.sentAt?.toISOString() ?? null,
    dismissedAt: row.dismissedAt?.toISOString() ?? null,
  };
}

function toInContext(row: { delivery: PacketDelivery; revision: number; jobId: string; jobTitle: string; siteId: string; siteLabel: string }): DeliveryInContext {
  const { delivery, ...context } = row;
  return { ...toDeliveryResponse(delivery), ...context };
}

const deliveryNotFound = () => new NotFoundError('DELIVERY_NOT_FOUND', 'No such delivery.');

/** What happens to one recipient address when the packet is sent. */
type Plan =
  | { kind: 'linked'; email: string }
  | { kind: 'link-account'; email: string; userId: string }
  | { kind: 'invited'; email: string; invitationId: string }
  | { kind: 'invite'; email: string; replaceInvitationId: string | null };

/**
 * Sending a ready packet revision: works out the recipients (linking each address to the site as its
 * homeowner, or inviting it to the portal with the invitation link in the packet e-mail), writes one
 * delivery per recipient and queues them, all or nothing. The e-mail itself goes from the send worker,
 * with retries; the caller gets 202 at once. A failed delivery can be sent again or dismissed.
 */
@Injectable()
export class DeliveryService {
  private readonly logger = new Logger(DeliveryService.name);

  constructor(
    private readonly repository: DeliveryRepository,
    private readonly queue: DeliveryQueue,
    private readonly audit: AuditService,
    private readonly config: ConfigService<Env, true>,
  ) {}

  async sendOptions(actor: AuthUser, revisionId: string): Promise<SendOptionsResponse> {
    const revision = await findOrFail(this.repository.revisionInCompany(actor.companyId, revisionId), packetNotFound);
    const [linked, invited] = await Promise.all([this.repository.siteHomeowners(revision.siteId), this.repository.openInvitationsForSite(revision.siteId)]);
    const emails = new Set(linked.map((h) => h.email));
    const maxAttachmentBytes = this.config.get('MAIL_MAX_ATTACHMENT_BYTES', { infer: true });
    return {
      homeowners: [
        ...linked.map((h) => ({ email: h.email, name: h.name, hasAccount: true })),
        ...invited.filter((i) => !emails.has(i.email)).map((i) => ({ email: i.email, name: null, hasAccount: false })),
      ],
      pdfBytes: revision.pdfBytes,
      maxAttachmentBytes,
      canAttachPdf: revision.pdfBytes !== null && revision.pdfBytes <= maxAttachmentBytes,
    };
  }

  async send(actor: AuthUser, revisionId: string, input: SendPacketParsed): Promise<SendPacketResponse> {
    const revision = await findOrFail(this.repository.revisionInCompany(actor.companyId, revisionId), packetNotFound);
    if (revision.status !== 'ready') {
      throw new ConflictError('PACKET_NOT_READY', `This packet revision is ${revision.status}, not ready to send.`);
    }
    const addresses = input.to ?? (await this.siteRecipientAddresses(revision.siteId));
    if (addresses.length === 0) {
      throw new RuleViolationError(
        'NO_RECIPIENT',
        'to: this site has no homeowner yet: give the homeowner’s e-mail (they are invited to the portal).',
        [{ path: 'to', message: 'this site has no homeowner yet' }],
      );
    }
    // Every address is checked before anything is written, so a refused one leaves no half-done send.
    const plans: Plan[] = [];
    for (const [index, email] of addresses.entries()) plans.push(await this.planFor(actor, revision.siteId, email, input.to ? index : null));
    const cc = [...new Set(input.cc ?? [])];
    const ttlHours = this.config.get('INVITATION_TTL_HOURS', { infer: true });
    const deliveries = await this.repository.transaction(async (tx) => {
      const recipients: { email: string; invitationId: string | null }[] = [];
      for (const plan of plans) recipients.push({ email: plan.email, invitationId: await this.carryOut(actor, revision.siteId, plan, ttlHours, tx) });
      const rows = await this.repository.insertDeliveries(
        recipients.map((r) => ({
          companyId: actor.companyId,
          revisionId,
          toAddress: r.email,
          ccAddresses: cc,
          message: input.message || null,
          wantsPdfAttached: (input.pdf ?? 'attached') === 'attached',
          invitationId: r.invitationId,
          requestedByUserId: actor.id,
        })),
        tx,
      );
      await this.audit.record(
        {
          companyId: actor.companyId,
          actorUserId: actor.id,
          action: 'packet.send',
          targetType: 'packet_revision',
          targetId: revisionId,
          details: { deliveryIds: rows.map((r) => r.id), to: rows.map((r) => r.toAddress), cc, pdf: input.pdf ?? 'attached' },
        },
        tx,
      );
      return rows;
    });
    for (const delivery of deliveries) await this.enqueue(delivery.id);
    return { deliveries: deliveries.map(toDeliveryResponse) };
  }

  async list(actor: AuthUser, revisionId: string): Promise<PacketDeliveryResponse[]> {
    if (!(await this.repository.revisionInCompany(actor.companyId, revisionId))) throw packetNotFound();
    return (await this.repository.listByRevision(actor.companyId, revisionId)).map(toDeliveryResponse);
  }

  async listForJob(actor: AuthUser, jobId: string): Promise<DeliveryInContext[]> {
    if (!(await this.repository.jobInCompany(actor.companyId, jobId))) {
      throw jobNotFound();
    }
    return (await this.repository.listByJob(actor.companyId, jobId)).map(toInContext);
  }

  /** Failed deliveries that still need the office: not sent since, not dismissed. */
  async openFailures(actor: AuthUser): Promise<DeliveryInContext[]> {
    return (await this.repository.listOpenFailures(actor.companyId)).map(toInContext);
  }

  /**
   * Sends a failed delivery again (it goes back to `queued` with a fresh round of attempts). A delivery
   * that was sent is sent again as a new delivery to the same recipient (the first stays in the log).
   * The invitation link, if any, is made afresh when the e-mail goes.
   */
  async resend(actor: AuthUser, id: string): Promise<PacketDeliveryResponse> {
    const delivery = await this.repository.transaction(async (tx) => {
      const row = await findOrFail(this.repository.deliveryInCompanyForUpdate(actor.companyId, id, tx), deliveryNotFound);
      if (row.status === 'queued' || row.status === 'sending') {
        throw new ConflictError('DELIVERY_IN_PROGRESS', 'This e-mail is already on its way.');
      }
      const revision = await this.repository.revisionInCompany(actor.companyId, row.revisionId);
      if (revision?.status !== 'ready') {
        throw new ConflictError('PACKET_NOT_READY', 'This packet revision is no longer ready to send.');
      }
      const next =
        row.status === 'failed'
          ? await this.repository.requeueFailed(row.id, tx)
          : (
              await this.repository.insertDeliveries(
                [
                  {
                    companyId: row.companyId,
                    revisionId: row.revisionId,
                    toAddress: row.toAddress,
                    ccAddresses: row.ccAddresses,
                    message: row.message,
                    wantsPdfAttached: row.wantsPdfAttached,
                    invitationId: row.invitationId,
                    requestedByUserId: actor.id,
                  },
                ],
                tx,
              )
            )[0]!;
      await this.audit.record(
        {
          companyId: actor.companyId,
          actorUserId: actor.id,
          action: 'packet.delivery.resend',
          targetType: 'packet_delivery',
          targetId: next.id,
          details: { from: row.id, to: row.toAddress, previousStatus: row.status },
        },
        tx,
      );
      return next;
    });
    await this.enqueue(delivery.id);
    return toDeliveryResponse(delivery);
  }

  /** Sets a failed delivery aside: it stays in the log but no longer asks for attention. */
  async dismiss(actor: AuthUser, id: string): Promise<PacketDeliveryResponse> {
    const delivery = await this.repository.transaction(async (tx) => {
      const row = await findOrFail(this.repository.deliveryInCompanyForUpdate(actor.companyId, id, tx), deliveryNotFound);
      if (row.status !== 'failed') {
        throw new ConflictError('DELIVERY_NOT_FAILED', `Only a failed delivery can be dismissed; this one is ${row.status}.`);
      }
      if (row.dismissedAt) return row;
      const dismissed = await this.repository.dismiss(row.id, actor.id, tx);
      await this.audit.record(
        { companyId: actor.companyId, actorUserId: actor.id, action: 'packet.delivery.dismiss', targetType: 'packet_delivery', targetId: row.id, details: { to: row.toAddress } },
        tx,
      );
      return dismissed;
    });
    return toDeliveryResponse(delivery);
  }

  private async enqueue(deliveryId: string): Promise<void> {
    await this.queue.enqueue({ deliveryId }).catch((error: unknown) => {
      // The delivery is committed and stays queued; a starting send worker re-queues it.
      this.logger.error(`delivery ${deliveryId} recorded but not queued: ${error instanceof Error ? error.message : String(error)}`);
    });
  }

  /** Linked homeowners, then people invited as the site's homeowner who have not accepted yet. */
  private async siteRecipientAddresses(siteId: string): Promise<string[]> {
    const [linked, invited] = await Promise.all([this.repository.siteHomeowners(siteId), this.repository.openInvitationsForSite(siteId)]);
    return [...new Set([...linked.map((h) => h.email), ...invited.map((i) => i.email)])];
  }

  /**
   * What sending to `email` takes: nothing (a homeowner of the site already), linking a homeowner
   * account of the company, reusing its open homeowner invitation, or a new invitation. A staff
   * account, a disabled one, or an open invitation to a staff role is refused (409 naming `to`).
   */
  private async planFor(actor: AuthUser, siteId: string, email: string, index: number | null): Promise<Plan> {
    const refuse = (message: string) => {
      const path = index === null ? 'to' : `to.${index}`;
      return new ConflictError('RECIPIENT_NOT_HOMEOWNER', `${path}: ${email} ${message}`, [{ path, message }]);
    };
    const user = await this.repository.companyUserByEmail(actor.companyId, email);
    if (user) {
      if (user.role !== 'homeowner' || user.isDisabled) throw refuse('belongs to an account that cannot be a homeowner of this site');
      const linked = await this.repository.siteHomeowners(siteId);
      return linked.some((h) => h.id === user.id) ? { kind: 'linked', email } : { kind: 'link-account', email, userId: user.id };
    }
    const open = await this.repository.unusedInvitation(actor.companyId, email);
    if (open && !open.isExpired) {
      if (open.role !== 'homeowner') throw refuse('has an open invitation to a staff role');
      return { kind: 'invited', email, invitationId: open.id };
    }
    if (!canInvite(actor.role, 'homeowner')) throw refuse('has no account, and your role cannot invite a homeowner');
    return { kind: 'invite', email, replaceInvitationId: open?.id ?? null };
  }

  /** Carries out a plan inside the send's transaction; answers the invitation the e-mail carries, if any. */
  private async carryOut(actor: AuthUser, siteId: string, plan: Plan, ttlHours: number, tx: Tx): Promise<string | null> {
    switch (plan.kind) {
      case 'linked':
        return null;
      case 'link-account':
        await this.repository.linkHomeowner(siteId, plan.userId, tx);
        await this.audit.record(
          { companyId: actor.companyId, actorUserId: actor.id, action: 'site.homeowner.link', targetType: 'site', targetId: siteId, details: { userId: plan.userId } },
          tx,
        );
        return null;
      case 'invited':
        await this.repository.addInvitationSite(plan.invitationId, siteId, tx);
        return plan.invitationId;
      case 'invite': {
        // An expired invitation still holds the company's one open slot for the address: withdraw it first.
        if (plan.replaceInvitationId) await this.repository.revokeInvitation(plan.replaceInvitationId, tx);
        const invitationId = await this.repository.insertHomeownerInvitation(
          {
            companyId: actor.companyId,
            email: plan.email,
            invitedByUserId: actor.id,
            tokenHash: hashToken(newOpaqueToken()),
            expiresAt: new Date(Date.now() + ttlHours * 3_600_000),
          },
          tx,
        );
        await this.repository.addInvitationSite(invitationId, siteId, tx);
        await this.audit.record(
          {
            companyId: actor.companyId,
            actorUserId: actor.id,
            action: 'invitation.create',
            targetType: 'invitation',
            targetId: invitationId,
            details: { email: plan.email, role: 'homeowner', withPacket: true },
          },
          tx,
        );
        return invitationId;
      }
    }
  }
}
