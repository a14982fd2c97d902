import { ConflictException, Injectable, Logger, NotFoundException, UnprocessableEntityException } from '@nestjs/common';

import { AuditService } from '../audit/audit.service.js';
import type { AuthUser } from '../common/decorators/current-user.decorator.js';
import type { PacketDelivery } from '../db/schema/index.js';
import type { PacketDeliveryResponse, SendPacketInput, SendPacketResponse } from '../domain/delivery/delivery.schema.js';
import { UsersService } from '../users/users.service.js';
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
    isPdfAttached: row.isPdfAttached,
    messageId: row.messageId,
    isInvited: row.invitationId !== null,
    requestedByUserId: row.requestedByUserId,
    createdAt: row.createdAt.toISOString(),
    sentAt: row.sentAt?.toISOString() ?? null,
  };
}

const packetNotFound = () => new NotFoundException({ message: 'No such packet revision.', code: 'PACKET_NOT_FOUND' });

interface Recipient {
  email: string;
  invitationId: string | null;
}

/**
 * Sending a ready packet revision to the site's homeowners: works out the recipients (linking or
 * inviting the `to` address as the site's homeowner when needed), writes one delivery per recipient and
 * queues them. The e-mail itself goes from the send worker, with retries; the caller gets 202 at once.
 */
@Injectable()
export class DeliveryService {
  private readonly logger = new Logger(DeliveryService.name);

  constructor(
    private readonly repository: DeliveryRepository,
    private readonly queue: DeliveryQueue,
    private readonly users: UsersService,
    private readonly audit: AuditService,
  ) {}

  async send(actor: AuthUser, revisionId: string, input: SendPacketInput): Promise<SendPacketResponse> {
    const revision = await this.repository.revisionInCompany(actor.companyId, revisionId);
    if (!revision) throw packetNotFound();
    if (revision.status !== 'ready') {
      throw new ConflictException({ message: `This packet revision is ${revision.status}, not ready to send.`, code: 'PACKET_NOT_READY' });
    }
    const recipients = input.to ? [await this.recipientFor(actor, revision.siteId, input.to)] : await this.siteRecipients(revision.siteId);
    if (recipients.length === 0) {
      throw new UnprocessableEntityException({
        message: 'This site has no homeowner yet: give the homeowner’s e-mail as `to` (they are invited to the portal).',
        code: 'NO_RECIPIENT',
      });
    }
    const cc = [...new Set(input.cc ?? [])];
    const deliveries = await this.repository.transaction(async (tx) => {
      const rows = await this.repository.insertDeliveries(
        recipients.map((r) => ({
          companyId: actor.companyId,
          revisionId,
          toAddress: r.email,
          ccAddresses: cc,
          message: input.message || null,
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
          details: { deliveryIds: rows.map((r) => r.id), to: rows.map((r) => r.toAddress), cc },
        },
        tx,
      );
      return rows;
    });
    for (const delivery of deliveries) {
      await this.queue.enqueue({ deliveryId: delivery.id }).catch((error: unknown) => {
        // The delivery is committed and stays queued; a starting send worker re-queues it.
        this.logger.error(`delivery ${delivery.id} recorded but not queued: ${error instanceof Error ? error.message : String(error)}`);
      });
    }
    return { deliveries: deliveries.map(toDeliveryResponse) };
  }

  async list(actor: AuthUser, revisionId: string): Promise<PacketDeliveryResponse[]> {
    if (!(await this.repository.revisionInCompany(actor.companyId, revisionId))) throw packetNotFound();
    return (await this.repository.listByRevision(actor.companyId, revisionId)).map(toDeliveryResponse);
  }

  /** Linked homeowners, then people invited as the site's homeowner who have not accepted yet. */
  private async siteRecipients(siteId: string): Promise<Recipient[]> {
    const [linked, invited] = await Promise.all([this.repository.siteHomeowners(siteId), this.repository.openInvitationsForSite(siteId)]);
    const emails = new Set(linked.map((h) => h.email));
    return [
      ...linked.map((h) => ({ email: h.email, invitationId: null })),
      ...invited.filter((i) => !emails.has(i.email)).map((i) => ({ email: i.email, invitationId: i.id })),
    ];
  }

  /**
   * The `to` address as a homeowner of the site: linked already; or a homeowner account of the company
   * (linked now); or someone without an account (invited now, linked when they accept).
   */
  private async recipientFor(actor: AuthUser, siteId: string, email: string): Promise<Recipient> {
    const user = await this.repository.userByEmail(email);
    if (user) {
      if (user.companyId !== actor.companyId || user.role !== 'homeowner') {
        throw new ConflictException({ message: 'This e-mail belongs to an account that cannot be a homeowner of this site.', code: 'RECIPIENT_NOT_HOMEOWNER' });
      }
      await this.repository.transaction(async (tx) => {
        await this.repository.linkHomeowner(siteId, user.id, tx);
        await this.audit.record({ companyId: actor.companyId, actorUserId: actor.id, action: 'site.homeowner.link', targetType: 'site', targetId: siteId, details: { userId: user.id } }, tx);
      });
      return { email, invitationId: null };
    }
    const open = await this.repository.openHomeownerInvitation(actor.companyId, email);
    if (open) {
      await this.repository.transaction((tx) => this.repository.addInvitationSite(open.id, siteId, tx));
      return { email, invitationId: open.id };
    }
    try {
      const invitation = await this.users.invite(actor, { email, role: 'homeowner' }, { siteIds: [siteId] });
      return { email, invitationId: invitation.id };
    } catch (error) {
      // Invitation mail is queued (it cannot fail on SMTP here); this covers a race with a second send
      // inviting the same address at the same moment: the other request's open invitation is used.
      this.logger.warn(`homeowner invitation for site ${siteId} not created here: ${error instanceof Error ? error.message : String(error)}`);
      const created = await this.repository.openHomeownerInvitation(actor.companyId, email);
      if (!created) throw error;
      return { email, invitationId: created.id };
    }
  }
}
