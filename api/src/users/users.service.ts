import { ConflictException, ForbiddenException, Injectable, NotFoundException } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';

import { AuditService } from '../audit/audit.service.js';
import { hashToken, newOpaqueToken } from '../auth/tokens.js';
import type { AuthUser } from '../common/decorators/current-user.decorator.js';
import type { Env } from '../config/env.schema.js';
import type {
  CreateInvitationInput,
  InvitationResponse,
  UpdateUserInput,
  UserResponse,
} from '../domain/auth/auth.schema.js';
import { canInvite, canManageUser, ROLE_LABELS } from '../domain/auth/roles.js';
import type { Invitation, User } from '../db/schema/index.js';
import { LinkBuilder } from '../mail/link-builder.js';
import { MailService } from '../mail/mail.service.js';
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

function toInvitationResponse(invitation: Invitation): InvitationResponse {
  return {
    id: invitation.id,
    email: invitation.email,
    name: invitation.name,
    role: invitation.role,
    expiresAt: invitation.expiresAt.toISOString(),
    createdAt: invitation.createdAt.toISOString(),
  };
}

@Injectable()
export class UsersService {
  constructor(
    private readonly repository: UsersRepository,
    private readonly audit: AuditService,
    private readonly mail: MailService,
    private readonly links: LinkBuilder,
    private readonly config: ConfigService<Env, true>,
  ) {}

  async list(actor: AuthUser): Promise<UserResponse[]> {
    return (await this.repository.listByCompany(actor.companyId)).map(toUserResponse);
  }

  async update(actor: AuthUser, id: string, input: UpdateUserInput): Promise<UserResponse> {
    const target = await this.repository.findInCompany(actor.companyId, id);
    if (!target) throw new NotFoundException({ message: 'No such user.', code: 'USER_NOT_FOUND' });
    if (!canManageUser(actor.role, actor.id, id)) {
      throw new ForbiddenException({ message: 'You cannot change this account.', code: 'CANNOT_MANAGE_USER' });
    }
    const updated = await this.repository.transaction(async (tx) => {
      const row = await this.repository.updateInCompany(actor.companyId, id, input, tx);
      await this.audit.record(
        { companyId: actor.companyId, actorUserId: actor.id, action: 'user.update', targetType: 'user', targetId: id, details: input },
        tx,
      );
      return row!;
    });
    return toUserResponse(updated);
  }

  async listInvitations(actor: AuthUser): Promise<InvitationResponse[]> {
    return (await this.repository.listOpenInvitations(actor.companyId)).map(toInvitationResponse);
  }

  /**
   * Creates a single-use, expiring invitation and e-mails its link; a newer invitation replaces an open
   * one. `siteIds` (homeowner invitations): sites the invitee is linked to on accepting.
   */
  async invite(actor: AuthUser, input: CreateInvitationInput, options: { siteIds?: readonly string[] } = {}): Promise<InvitationResponse> {
    if (!canInvite(actor.role, input.role)) {
      throw new ForbiddenException({ message: `Your role cannot invite a ${ROLE_LABELS[input.role].toLowerCase()}.`, code: 'CANNOT_INVITE_ROLE' });
    }
    if (await this.repository.emailExists(input.email)) {
      throw new ConflictException({ message: 'Someone already has an account with this e-mail.', code: 'EMAIL_TAKEN' });
    }
    const token = newOpaqueToken();
    const hours = this.config.get('INVITATION_TTL_HOURS', { infer: true });
    const invitation = await this.repository.transaction(async (tx) => {
      await this.repository.revokeOpenInvitationsFor(input.email, tx);
      const row = await this.repository.insertInvitation(
        {
          companyId: actor.companyId,
          email: input.email,
          name: input.name ?? null,
          role: input.role,
          tokenHash: hashToken(token),
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
      return row;
    });
    await this.mail.send({
      template: 'invitation',
      to: input.email,
      companyId: actor.companyId,
      data: {
        name: input.name ?? null,
        inviterName: actor.name,
        companyName: await this.repository.companyName(actor.companyId),
        roleLabel: ROLE_LABELS[input.role],
        isHomeowner: input.role === 'homeowner',
        link: this.links.to('/accept-invitation', { token }),
        hours,
      },
    });
    return toInvitationResponse(invitation);
  }

  async revokeInvitation(actor: AuthUser, id: string): Promise<void> {
    const revoked = await this.repository.transaction(async (tx) => {
      const row = await this.repository.revokeInvitationInCompany(actor.companyId, id, tx);
      if (row) {
        await this.audit.record(
          { companyId: actor.companyId, actorUserId: actor.id, action: 'invitation.revoke', targetType: 'invitation', targetId: id },
          tx,
        );
      }
      return row;
    });
    if (!revoked) throw new NotFoundException({ message: 'No such open invitation.', code: 'INVITATION_NOT_FOUND' });
  }
}
