import { Injectable } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';

import type { AuthUser } from '../common/decorators/current-user.decorator.js';
import { type Env, mailDestination } from '../config/env.schema.js';
import { NotFoundError } from '../domain/errors.js';
import type { MailStatusResponse } from '../domain/signup/signup.schema.js';
import type { OutboxListResponse, OutboxMessageResponse, OutboxQuery } from '../domain/mail/outbox.schema.js';
import { LocalSmtpServer } from './local-smtp.server.js';
import { MailCaptureRepository } from './mail-capture.repository.js';

/** Reads what the local SMTP stand-in captured, for the company of the signed-in admin or office user. */
@Injectable()
export class OutboxService {
  constructor(
    private readonly repository: MailCaptureRepository,
    private readonly localServer: LocalSmtpServer,
    private readonly config: ConfigService<Env, true>,
  ) {}

  status(): MailStatusResponse {
    const captured = this.localServer.isEnabled;
    return { captured, destination: captured ? null : mailDestination(this.config.get('SMTP_URL', { infer: true })) };
  }

  async list(user: AuthUser, query: OutboxQuery): Promise<OutboxListResponse> {
    this.requireLocalMail();
    const { rows, total } = await this.repository.listByCompany(
      user.companyId,
      query.pageSize,
      (query.page - 1) * query.pageSize,
    );
    return {
      items: rows.map((r) => ({
        id: r.id,
        from: r.fromAddress,
        to: r.toAddresses,
        subject: r.subject,
        receivedAt: r.receivedAt.toISOString(),
      })),
      total,
      page: query.page,
      pageSize: query.pageSize,
    };
  }

  async get(user: AuthUser, id: string): Promise<OutboxMessageResponse> {
    this.requireLocalMail();
    const mail = await this.repository.findInCompany(user.companyId, id);
    if (!mail) throw new NotFoundError('MESSAGE_NOT_FOUND', 'No such message.');
    return {
      id: mail.id,
      from: mail.fromAddress,
      to: mail.toAddresses,
      subject: mail.subject,
      receivedAt: mail.receivedAt.toISOString(),
      text: mail.text,
      html: mail.html,
      headers: mail.headers,
      attachments: mail.attachments,
    };
  }

  async attachment(user: AuthUser, mailId: string, attachmentId: string) {
    this.requireLocalMail();
    const attachment = await this.repository.findAttachmentInCompany(user.companyId, mailId, attachmentId);
    if (!attachment) throw new NotFoundError('ATTACHMENT_NOT_FOUND', 'No such attachment.');
    return attachment;
  }

  /** With a hosted mail service (SMTP_URL) there is nothing local to show. */
  private requireLocalMail(): void {
    if (!this.localServer.isEnabled) {
      throw new NotFoundError('NO_LOCAL_MAIL', 'The outbox exists only with the local mail server.');
    }
  }
}
