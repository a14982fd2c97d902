import { GoneException, Injectable } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';

import { ConflictError, ForbiddenError, NotFoundError, ValidationError } from '../domain/errors.js';
import { AuditService } from '../audit/audit.service.js';
import { AuthService, type ClientMeta, type IssuedSession } from '../auth/auth.service.js';
import { PasswordHasher } from '../auth/password-hasher.js';
import { hashToken, newOpaqueToken } from '../auth/tokens.js';
import { isUniqueViolation } from '../common/db-errors.js';
import type { Env } from '../config/env.schema.js';
import type {
  CreateSignupInput,
  SignupAcceptedResponse,
  SignupMailResponse,
  SignupStatusResponse,
} from '../domain/signup/signup.schema.js';
import { LocalSmtpServer } from '../mail/local-smtp.server.js';
import { OutgoingMailService } from '../outgoing-mail/outgoing-mail.service.js';
import { SignupRepository } from './signup.repository.js';

/** The one answer to an accepted sign-up request, whether or not the address already has an account. */
const ACCEPTED_MESSAGE =
  'Check your e-mail: we sent a message to that address. Follow its link to confirm the address and create the company.';

const emailTaken = () =>
  new ConflictError('EMAIL_TAKEN', 'An account with this e-mail already exists. Sign in, or reset your password.');

/**
 * Company sign-up: a request records a pending sign-up and queues its verification e-mail (the link
 * is minted when the mail goes, see AccountMailWorker); following the link creates the company, its
 * default settings and its first admin in one transaction and signs the admin in.
 *
 * The request's answer never tells whether the address has an account: a taken address gets the same
 * answer, nothing is created, and its owner is mailed a note instead.
 */
@Injectable()
export class SignupService {
  constructor(
    private readonly repository: SignupRepository,
    private readonly outgoingMail: OutgoingMailService,
    private readonly hasher: PasswordHasher,
    private readonly auth: AuthService,
    private readonly audit: AuditService,
    private readonly localServer: LocalSmtpServer,
    private readonly config: ConfigService<Env, true>,
  ) {}

  async status(): Promise<SignupStatusResponse> {
    return {
      mode: this.config.get('SIGNUP_MODE', { infer: true }),
      hasCompanies: await this.repository.hasCompanies(),
      mailCaptured: this.localServer.isEnabled,
      contact: this.config.get('SIGNUP_CONTACT', { infer: true }) ?? null,
    };
  }

  async request(input: CreateSignupInput): Promise<SignupAcceptedResponse> {
    const mode = this.config.get('SIGNUP_MODE', { infer: true });
    if (mode === 'closed') {
      const contact = this.config.get('SIGNUP_CONTACT', { infer: true });
      throw new ForbiddenError(
        'SIGNUP_CLOSED',
        `Sign-up is closed on this server: companies are created by its operator${contact ? ` (${contact})` : ''}.`,
      );
    }
    let inviteCodeId: string | null = null;
    if (mode === 'invite') {
      if (!input.inviteCode) throw inviteCodeError('is required: sign-up on this server needs an invitation code');
      const code = await this.repository.findUsableInviteCode(hashToken(input.inviteCode.toUpperCase()));
      if (!code) throw inviteCodeError('is not valid, has expired or has been used');
      inviteCodeId = code.id;
    }

    // Hashed on both paths, so the answer takes about as long for a taken address as for a new one.
    const passwordHash = await this.hasher.hash(input.password);
    const receipt = newOpaqueToken();
    const receiptHash = hashToken(receipt);
    const account = await this.repository.findAccount(input.email);

    const mail = await this.repository.transaction(async (tx) => {
      if (account) {
        return this.outgoingMail.queueSignupNotice(tx, {
          companyId: account.companyId,
          to: input.email,
          receiptHash,
          data: { name: account.name, companyName: account.companyName },
        });
      }
      await this.repository.supersedeOpen(input.email, tx);
      const hours = this.config.get('SIGNUP_TTL_HOURS', { infer: true });
      const signup = await this.repository.insertSignup(
        {
          email: input.email,
          companyName: input.companyName,
          adminName: input.name,
          passwordHash,
          tokenHash: this.outgoingMail.sealedTokenHash(),
          expiresAt: new Date(Date.now() + hours * 3_600_000),
          inviteCodeId,
        },
        tx,
      );
      return this.outgoingMail.queueSignupVerification(tx, {
        signupId: signup.id,
        to: input.email,
        receiptHash,
        data: { name: input.name, companyName: input.companyName },
      });
    });
    await this.outgoingMail.dispatch(mail.id);
    return { message: ACCEPTED_MESSAGE, receipt };
  }

  /** With mail captured locally: the message sent for a sign-up request, so the page can show it. */
  async mailForReceipt(receipt: string): Promise<SignupMailResponse> {
    if (!this.localServer.isEnabled) {
      throw new NotFoundError('NO_LOCAL_MAIL', 'Mail goes to a mail service on this server; read it in your inbox.');
    }
    const found = receipt.length >= 20 && receipt.length <= 200 ? await this.repository.mailForReceipt(hashToken(receipt)) : undefined;
    if (!found) throw new NotFoundError('RECEIPT_NOT_FOUND', 'No sign-up request with this receipt.');
    const status = found.status === 'sent' ? 'sent' : found.status === 'failed' || found.status === 'cancelled' ? 'failed' : 'queued';
    return {
      status,
      message: found.captured
        ? {
            to: found.captured.toAddresses,
            subject: found.captured.subject,
            receivedAt: found.captured.receivedAt.toISOString(),
            text: found.captured.text,
            html: found.captured.html,
          }
        : null,
    };
  }

  /** Follows a verification link: creates the company and its first admin, then signs the admin in. */
  async verify(token: string, meta: ClientMeta): Promise<IssuedSession> {
    const created = await this.repository
      .transaction(async (tx) => {
        const signup = await this.repository.lockByTokenHash(hashToken(token), tx);
        if (!signup) {
          throw new NotFoundError('LINK_NOT_VALID', 'This link is not valid. Check that you copied all of it.');
        }
        if (signup.completedAt) {
          throw new GoneException({
            message: 'This link has already been used: the company exists. Sign in with your e-mail and password.',
            code: 'SIGNUP_ALREADY_COMPLETED',
          });
        }
        if (signup.supersededAt) {
          throw new GoneException({
            message: 'A newer sign-up with this address replaced this one. Use the link in the newest message.',
            code: 'SIGNUP_SUPERSEDED',
          });
        }
        if (signup.expiresAt <= new Date()) {
          throw new GoneException({ message: 'This link has expired. Sign up again to get a new one.', code: 'SIGNUP_EXPIRED' });
        }
        if (await this.repository.emailTaken(signup.email, tx)) throw emailTaken();
        const { companyId, admin } = await this.repository.createCompanyWithAdmin(signup, tx);
        if (signup.inviteCodeId && !(await this.repository.claimInviteCode(signup.inviteCodeId, companyId, tx))) {
          throw new ConflictError('INVITE_CODE_USED', 'The invitation code of this sign-up was used by another company meanwhile. Ask for a new code.');
        }
        await this.audit.record(
          { companyId, actorUserId: admin.id, action: 'company.sign_up', targetType: 'company', targetId: companyId, details: { signupId: signup.id } },
          tx,
        );
        return { admin, companyName: signup.companyName };
      })
      .catch((error: unknown) => {
        // Another account took the address between the check and the insert.
        if (isUniqueViolation(error)) throw emailTaken();
        throw error;
      });
    return this.auth.signIn({ ...created.admin, companyName: created.companyName }, meta);
  }
}

function inviteCodeError(message: string) {
  return new ValidationError([{ path: 'inviteCode', message }]);
}
