import { Injectable } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';

import { AuditService } from '../audit/audit.service.js';
import type { AuthUser } from '../common/decorators/current-user.decorator.js';
import type { Env } from '../config/env.schema.js';
import type {
  CreateInvitationInput,
  InvitationResponse,
  UpdateUserInput,
  UserListQuery,
  UserListResponse,
  UserResponse,
} from '../domain/auth/auth.schema.js';
import { ConflictError, findOrFail, ForbiddenError, NotFoundError } from '../domain/errors.js';
import { canInvite, canManageUser, ROLE_LABELS } from '../domain/auth/roles.js';
import { cursorPageOf } from '../domain/paging/page.schema.js';
import type { Invitation, OutgoingMailRow, User } from '../db/schema/index.js';
import { OutgoingMailService } from '../outgoing-mail/outgoing-mail.service.js';
import { UsersRepository } from './users.repository.js';

function toUserResponse(user: User): UserResponse {
  return {
    id: user.id,
    email: user.email,
    name: user.name,
    role: user.role,
    isDisabled: user.isDisabled,
    lastSignInAt: user.lastSignInAt?.toISOString() ?? null,
    createdAt: user.createdAt.toISOString(),
  };
}

function toInvitationResponse(invitation: Invitation, mail: OutgoingMailRow | undefined): InvitationResponse {
  return {
    id: invitation.id,
    email: invitation.email,
    name: invitation.name,
    role: invitation.role,
    expiresAt: invitation.expiresAt.toISOString(),
    createdAt: invitation.createdAt.toISOString(),
    mail: mail
      ? { status: mail.status, attempts: mail.attempts, lastError: mail.lastError, sentAt: mail.sentAt?.toISOString() ?? null }
      : null,
  };
}

/** Only a role that may send an invitation may revoke, resend or replace it: admin invitations are admins' alone. */
const adminInvitationOnly = () =>
  new ForbiddenError('CANNOT_MANAGE_INVITATION', 'Only an admin can change an invitation for an admin.');

const invitationNotFound = () => new NotFoundError('INVITATION_NOT_FOUND', 'No such open invitation.');

@Injectable()
export class UsersService {
  constructor(
    private readonly repository: UsersRepository,
    private readonly audit: AuditService,
    private readonly outgoingMail: OutgoingMailService,
    private readonly config: ConfigService<Env, true>,
  ) {}

  async list(actor: AuthUser, query: UserListQuery): Promise<UserListResponse> {
    const { rows, total } = await this.repository.listByCompany(actor.companyId, query);
    return cursorPageOf(rows, total, query, (row) => row.name, toUserResponse);
  }

  async update(actor: AuthUser, id: string, input: UpdateUserInput): Promise<UserResponse> {
    const target = await this.repository.findInCompany(actor.companyId, id);
    if (!target) throw new NotFoundError('USER_NOT_FOUND', 'No such user.');
    if (!canManageUser(actor.role, actor.id, id)) {
      throw new ForbiddenError('CANNOT_MANAGE_USER', 'You cannot change this account.');
    }
    const updated = await this.repository.transaction(async (tx) => {
      const row = await this.repository.updateInCompany(actor.companyId, id, input, tx);
      // A disabled account loses every session at once (its access tokens already fail on the next
      // request), so enabling it again later revives none of its earlier refresh tokens.
      if (input.isDisabled === true) await this.repository.revokeSessionsOf(id, tx);
      await this.audit.record(
        { companyId: actor.companyId, actorUserId: actor.id, action: 'user.update', targetType: 'user', targetId: id, details: input },
        tx,
      );
      return row!;
    });
    return toUserResponse(updated);
  }

  async listInvitations(actor: AuthUser): Promise<InvitationResponse[]> {
    const open = await this.repository.listOpenInvitations(actor.companyId);
    const mail = await this.outgoingMail.latestForInvitations(open.map((i) => i.id));
    return open.map((invitation) => toInvitationResponse(invitation, mail.get(invitation.id)));
  }

  /**
   * Creates a single-use, expiring invitation and queues its e-mail in the same transaction (the link is
   * minted when the mail goes; see AccountMailWorker); a newer invitation replaces an open one.
   * `siteIds` (homeowner invitations): sites the invitee is linked to on accepting.
   */
  async invite(actor: AuthUser, input: CreateInvitationInput, options: { siteIds?: readonly string[] } = {}): Promise<InvitationResponse> {
    if (!canInvite(actor.role, input.role)) {
      throw new ForbiddenError('CANNOT_INVITE_ROLE', `Your role cannot invite a ${ROLE_LABELS[input.role].toLowerCase()}.`);
    }
    // Only accounts in the actor's own company are named. An address with an account in another
    // company gets an invitation like any other (nothing here tells the inviter it exists); its owner
    // learns on the link that the address already has an account (EMAIL_TAKEN when accepting).
    if (await this.repository.emailExistsInCompany(actor.companyId, input.email)) {
      throw new ConflictError('EMAIL_TAKEN', 'Someone in your company already has an account with this e-mail.');
    }
    const hours = this.config.get('INVITATION_TTL_HOURS', { infer: true });
    const companyName = await this.repository.companyName(actor.companyId);
    const { invitation, mail } = await this.repository.transaction(async (tx) => {
      // A new invitation replaces this company's open one for the address: only someone who may
      // invite that one's role may replace it (office cannot displace an admin's admin invitation).
      const replaced = await this.repository.openInvitationsFor(actor.companyId, input.email, tx);
      if (replaced.some((open) => !canInvite(actor.role, open.role))) throw adminInvitationOnly();
      await this.repository.revokeOpenInvitationsFor(actor.companyId, input.email, tx);
      const row = await this.repository.insertInvitation(
        {
          companyId: actor.companyId,
          email: input.email,
          name: input.name ?? null,
          role: input.role,
          tokenHash: this.outgoingMail.sealedTokenHash(),
          invitedByUserId: actor.id,
          expiresAt: new Date(Date.now() + hours * 3_600_000),
        },
        tx,
      );
      if (input.role === 'homeowner' && options.siteIds?.length) await this.repository.insertInvitationSites(row.id, options.siteIds, tx);
      await this.audit.record(
        {
          companyId: actor.companyId,
          actorUserId: actor.id,
          action: 'invitation.create',
          targetType: 'invitation',
          targetId: row.id,
          details: { email: input.email, role: input.role },
        },
        tx,
      );
      const queued = await this.outgoingMail.queueInvitation(tx, {
        companyId: actor.companyId,
        invitationId: row.id,
        to: input.email,
        data: {
          name: input.name ?? null,
          inviterName: actor.name,
          companyName,
          roleLabel: ROLE_LABELS[input.role],
          isHomeowner: input.role === 'homeowner',
        },
      });
      return { invitation: row, mail: queued };
    });
    await this.outgoingMail.dispatch(mail.id);
    return toInvitationResponse(invitation, mail);
  }

  /**
   * Sends an open invitation's e-mail again with a new link (the earlier link stops working once the new
   * one is minted); for a message that failed or went astray.
   */
  async resendInvitation(actor: AuthUser, id: string): Promise<InvitationResponse> {
    const invitation = await findOrFail(this.repository.findOpenInvitationInCompany(actor.companyId, id), invitationNotFound);
    if (!canInvite(actor.role, invitation.role)) throw adminInvitationOnly();
    const [inviter, companyName] = await Promise.all([
      invitation.invitedByUserId ? this.repository.findInCompany(actor.companyId, invitation.invitedByUserId) : undefined,
      this.repository.companyName(actor.companyId),
    ]);
    const mail = await this.repository.transaction(async (tx) => {
      await this.outgoingMail.cancelWaitingForInvitation(tx, invitation.id);
      const queued = await this.outgoingMail.queueInvitation(tx, {
        companyId: actor.companyId,
        invitationId: invitation.id,
        to: invitation.email,
        data: {
          name: invitation.name,
          inviterName: inviter?.name ?? actor.name,
          companyName,
          roleLabel: ROLE_LABELS[invitation.role],
          isHomeowner: invitation.role === 'homeowner',
        },
      });
      await this.audit.record(
        { companyId: actor.companyId, actorUserId: actor.id, action: 'invitation.resend', targetType: 'invitation', targetId: invitation.id },
        tx,
      );
      return queued;
    });
    await this.outgoingMail.dispatch(mail.id);
    return toInvitationResponse(invitation, mail);
  }

  async revokeInvitation(actor: AuthUser, id: string): Promise<void> {
    const revoked = await this.repository.transaction(async (tx) => {
      const row = await this.repository.revokeInvitationInCompany(actor.companyId, id, tx);
      // Thrown inside the transaction, so the revocation above is rolled back.
      if (row && !canInvite(actor.role, row.role)) throw adminInvitationOnly();
      if (row) {
        await this.audit.record(
          { companyId: actor.companyId, actorUserId: actor.id, action: 'invitation.revoke', targetType: 'invitation', targetId: id },
          tx,
        );
      }
      return row;
    });
    if (!revoked) throw invitationNotFound();
  }
}
