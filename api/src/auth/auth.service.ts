import { randomUUID } from 'node:crypto';

import { Injectable, Logger, NotFoundException, UnauthorizedException } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { JwtService } from '@nestjs/jwt';

import { ConflictError, NotFoundError } from '../domain/errors.js';
import { AuditService } from '../audit/audit.service.js';
import type { Tx } from '../db/db.module.js';
import type { AuthUser } from '../common/decorators/current-user.decorator.js';
import type { Env } from '../config/env.schema.js';
import type {
  AcceptInvitationInput,
  InvitationPreviewResponse,
  MeResponse,
  ResetPasswordInput,
  SessionResponse,
} from '../domain/auth/auth.schema.js';
import { OutgoingMailService } from '../outgoing-mail/outgoing-mail.service.js';
import { AuthRepository, type UserWithCompany } from './auth.repository.js';
import { PasswordHasher } from './password-hasher.js';
import { PasswordResetRequests } from './password-reset-requests.js';
import { hashToken, newOpaqueToken, successorKey, successorToken } from './tokens.js';

export interface ClientMeta {
  ip: string | undefined;
  userAgent: string | undefined;
}

/** A session as issued: the body for the client plus the refresh token for the cookie. */
export interface IssuedSession {
  body: SessionResponse;
  refreshToken: string;
  refreshExpiresAt: Date;
}

export interface AccessTokenPayload {
  sub: string;
  cid: string;
  role: AuthUser['role'];
}

const SIGN_IN_FAILED = { message: 'E-mail or password is incorrect.', code: 'SIGN_IN_FAILED' };

function toMe(user: UserWithCompany): MeResponse {
  return {
    id: user.id,
    email: user.email,
    name: user.name,
    role: user.role,
    companyId: user.companyId,
    companyName: user.companyName,
  };
}

@Injectable()
export class AuthService {
  private readonly logger = new Logger(AuthService.name);
  private readonly successorKey: Buffer;

  constructor(
    private readonly repository: AuthRepository,
    private readonly hasher: PasswordHasher,
    private readonly jwt: JwtService,
    private readonly config: ConfigService<Env, true>,
    private readonly audit: AuditService,
    private readonly outgoingMail: OutgoingMailService,
    private readonly resetRequests: PasswordResetRequests,
  ) {
    this.successorKey = successorKey(this.config.get('JWT_ACCESS_SECRET', { infer: true }));
    this.resetRequests.setWorker((email) => this.processPasswordResetRequest(email));
  }

  /**
   * The local strategy's check. Unknown e-mail, wrong password and disabled account all give the same
   * answer in about the same time, so sign-in cannot be used to learn who has an account.
   */
  async validateCredentials(email: string, password: string): Promise<UserWithCompany> {
    const user = await this.repository.findUserByEmail(email.trim().toLowerCase());
    const ok = await this.hasher.verify(user?.passwordHash, password);
    if (!user || !ok || user.isDisabled) throw new UnauthorizedException(SIGN_IN_FAILED);
    return user;
  }

  /** The JWT strategy's check on every request: the account must still exist and be enabled. */
  async validateAccessToken(payload: AccessTokenPayload): Promise<AuthUser> {
    const user = await this.repository.findUserById(payload.sub);
    if (!user || user.isDisabled) {
      throw new UnauthorizedException({ message: 'Your session has ended; sign in again.', code: 'SESSION_ENDED' });
    }
    return { id: user.id, companyId: user.companyId, role: user.role, email: user.email, name: user.name };
  }

  async signIn(user: UserWithCompany, meta: ClientMeta): Promise<IssuedSession> {
    await this.repository.touchLastSignIn(user.id);
    await this.audit.record({
      companyId: user.companyId,
      actorUserId: user.id,
      action: 'user.sign_in',
      targetType: 'user',
      targetId: user.id,
      details: { ip: meta.ip },
    });
    return this.issueSession(user, meta, randomUUID());
  }

  /**
   * Rotates a refresh token. A token that was already rotated is evidence of theft (the legitimate
   * client and an attacker both hold it): the whole family is revoked and both must sign in again —
   * unless it was rotated less than REFRESH_REUSE_GRACE_SECONDS ago. Then the request is one of several
   * made at once with the same cookie (two tabs opening together, a browser restoring its session) and
   * gets the same successor the first request got (see `successorToken`), not a new family member.
   */
  async refresh(refreshToken: string | undefined, meta: ClientMeta): Promise<IssuedSession> {
    const invalid = new UnauthorizedException({ message: 'Your session has ended; sign in again.', code: 'SESSION_ENDED' });
    if (!refreshToken) throw invalid;
    const session = await this.repository.findRefreshSession(hashToken(refreshToken));
    if (!session || session.revokedAt || session.expiresAt <= new Date()) throw invalid;
    const user = await this.repository.findUserById(session.userId);
    if (!user || user.isDisabled) throw invalid;

    const successor = successorToken(this.successorKey, refreshToken);
    const rotated = await this.repository.transaction(async (tx) => {
      // The claim waits for a concurrent claim of the same row to commit, so when it fails the
      // successor that request inserted is already visible to the grace check below.
      if (!(await this.repository.claimRefreshSession(session.id, tx))) return undefined;
      return this.issueSession(user, meta, session.familyId, tx, successor);
    });
    if (rotated) return rotated;

    const late = await this.successorWithinGrace(refreshToken, session.familyId);
    if (late === 'ended') throw invalid;
    if (late) return this.sessionFor(user, late.token, late.expiresAt);

    await this.repository.revokeFamily(session.familyId);
    await this.audit.record({
      companyId: user.companyId,
      actorUserId: user.id,
      action: 'session.reuse_detected',
      targetType: 'user',
      targetId: user.id,
      details: { ip: meta.ip },
    });
    this.logger.warn(`refresh token reuse detected for user ${user.id}; family revoked`);
    throw new UnauthorizedException({
      message: 'This session was used from somewhere else and has been closed; sign in again.',
      code: 'REFRESH_TOKEN_REUSED',
    });
  }

  /**
   * The live token a just-rotated `token` leads to, when every rotation on the way happened within the
   * grace window (a chain, because the first tab may already have refreshed again); `'ended'` when the
   * family was revoked meanwhile (signed out); `undefined` when it is reuse.
   */
  private async successorWithinGrace(
    token: string,
    familyId: string,
  ): Promise<{ token: string; expiresAt: Date } | 'ended' | undefined> {
    const graceMs = this.config.get('REFRESH_REUSE_GRACE_SECONDS', { infer: true }) * 1000;
    if (graceMs <= 0) return undefined;
    let current = token;
    for (let hop = 0; hop < 4; hop++) {
      const row = await this.repository.findRefreshSession(hashToken(current));
      if (!row || row.familyId !== familyId) return undefined;
      if (row.revokedAt || row.expiresAt <= new Date()) return 'ended';
      if (!row.replacedAt) return hop === 0 ? undefined : { token: current, expiresAt: row.expiresAt };
      if (Date.now() - row.replacedAt.getTime() > graceMs) return undefined;
      current = successorToken(this.successorKey, current);
    }
    return undefined;
  }

  async signOut(refreshToken: string | undefined): Promise<void> {
    if (!refreshToken) return;
    const session = await this.repository.findRefreshSession(hashToken(refreshToken));
    if (session) await this.repository.revokeFamily(session.familyId);
  }

  async me(userId: string): Promise<MeResponse> {
    const user = await this.repository.findUserById(userId);
    if (!user) throw new NotFoundException();
    return toMe(user);
  }

  async previewInvitation(token: string): Promise<InvitationPreviewResponse> {
    const invitation = await this.repository.findOpenInvitation(hashToken(token));
    if (!invitation) throw this.linkNotValid();
    return { email: invitation.email, name: invitation.name, role: invitation.role, companyName: invitation.companyName };
  }

  /** Creates the account from a single-use invitation and signs the new user in. */
  async acceptInvitation(input: AcceptInvitationInput, meta: ClientMeta): Promise<IssuedSession> {
    const invitation = await this.repository.findOpenInvitation(hashToken(input.token));
    if (!invitation) throw this.linkNotValid();
    if (await this.repository.findUserByEmail(invitation.email)) {
      throw new ConflictError('EMAIL_TAKEN', 'An account with this e-mail already exists.');
    }
    const passwordHash = await this.hasher.hash(input.password);
    const userId = await this.repository.transaction(async (tx) => {
      if (!(await this.repository.claimInvitation(invitation.id, tx))) return undefined;
      const user = await this.repository.insertUser(
        { companyId: invitation.companyId, email: invitation.email, name: input.name, role: invitation.role, passwordHash },
        tx,
      );
      if (invitation.role === 'homeowner') await this.repository.linkInvitedSites(invitation.id, user.id, tx);
      await this.audit.record(
        {
          companyId: invitation.companyId,
          actorUserId: user.id,
          action: 'invitation.accept',
          targetType: 'invitation',
          targetId: invitation.id,
        },
        tx,
      );
      return user.id;
    });
    if (!userId) throw this.linkNotValid();
    const user = await this.repository.findUserById(userId);
    return this.signIn(user!, meta);
  }

  /**
   * Queues the request and answers: for an address with an account and one without, the request does
   * exactly the same work (it is queued, nothing is looked up), so neither the answer nor its timing
   * tells who has an account, even while the mail server is down. The lookup and the e-mail happen in
   * the background (`PasswordResetRequests`, then `processPasswordResetRequest`).
   */
  requestPasswordReset(email: string): void {
    this.resetRequests.add(email);
  }

  /** A queued reset request: a reset link is queued when the address belongs to an enabled account. */
  async processPasswordResetRequest(email: string): Promise<void> {
    const user = await this.repository.findUserByEmail(email);
    if (!user || user.isDisabled) return;
    const minutes = this.config.get('PASSWORD_RESET_TTL_MINUTES', { infer: true });
    const mail = await this.repository.transaction(async (tx) => {
      // The link is minted when the mail goes (AccountMailWorker); until then the row cannot be used.
      const resetId = await this.repository.insertPasswordReset(
        user.id,
        this.outgoingMail.sealedTokenHash(),
        new Date(Date.now() + minutes * 60_000),
        tx,
      );
      await this.audit.record(
        { companyId: user.companyId, actorUserId: null, action: 'password_reset.request', targetType: 'user', targetId: user.id },
        tx,
      );
      return this.outgoingMail.queuePasswordReset(tx, {
        companyId: user.companyId,
        passwordResetId: resetId,
        to: user.email,
        data: { name: user.name, companyName: user.companyName },
      });
    });
    await this.outgoingMail.dispatch(mail.id);
  }

  /** Sets a new password from a single-use reset link and ends every session of that account. */
  async resetPassword(input: ResetPasswordInput): Promise<void> {
    const passwordHash = await this.hasher.hash(input.password);
    const userId = await this.repository.transaction(async (tx) => {
      const id = await this.repository.consumePasswordReset(hashToken(input.token), tx);
      if (!id) return undefined;
      await this.repository.setPassword(id, passwordHash, tx);
      await this.repository.revokeAllForUser(id, tx);
      return id;
    });
    if (!userId) throw this.linkNotValid();
    const user = await this.repository.findUserById(userId);
    if (user) {
      await this.audit.record({
        companyId: user.companyId,
        actorUserId: user.id,
        action: 'password_reset.complete',
        targetType: 'user',
        targetId: user.id,
      });
    }
  }

  private async issueSession(
    user: UserWithCompany,
    meta: ClientMeta,
    familyId: string,
    tx?: Tx,
    refreshToken: string = newOpaqueToken(),
  ): Promise<IssuedSession> {
    const refreshExpiresAt = new Date(Date.now() + this.config.get('REFRESH_TOKEN_TTL_DAYS', { infer: true }) * 86_400_000);
    await this.repository.insertRefreshSession(
      {
        userId: user.id,
        familyId,
        tokenHash: hashToken(refreshToken),
        expiresAt: refreshExpiresAt,
        userAgent: meta.userAgent?.slice(0, 300) ?? null,
        ip: meta.ip ?? null,
      },
      tx,
    );
    return this.sessionFor(user, refreshToken, refreshExpiresAt);
  }

  /** A new access token for `user` alongside a refresh token that is already stored. */
  private async sessionFor(user: UserWithCompany, refreshToken: string, refreshExpiresAt: Date): Promise<IssuedSession> {
    const expiresInSeconds = this.config.get('ACCESS_TOKEN_TTL_SECONDS', { infer: true });
    const payload: AccessTokenPayload = { sub: user.id, cid: user.companyId, role: user.role };
    const accessToken = await this.jwt.signAsync(payload, { expiresIn: expiresInSeconds });
    return { body: { accessToken, expiresInSeconds, user: toMe(user) }, refreshToken, refreshExpiresAt };
  }

  private linkNotValid() {
    return new NotFoundError('LINK_NOT_VALID', 'This link has expired or has already been used. Ask for a new one.');
  }
}
