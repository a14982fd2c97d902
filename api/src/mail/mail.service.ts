import { Injectable, Logger } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import nodemailer, { type Transporter } from 'nodemailer';

import type { Env } from '../config/env.schema.js';
import { LocalSmtpServer } from './local-smtp.server.js';
import { type MailTemplateName, MailTemplates } from './mail-templates.js';
import { type MailSender, senderFrom } from './sender.js';

export interface OutgoingMail {
  template: MailTemplateName;
  to: string;
  cc?: string[];
  /** Tags the message so the local Outbox shows it only to that company (null: a sign-up, no company yet). */
  companyId: string | null;
  data: Record<string, unknown>;
  attachments?: { filename: string; content: Buffer; contentType: string }[];
  /** Sent on behalf of a company: its name on From, its e-mail as Reply-To (packet e-mails). */
  sender?: MailSender;
}

/** Sends templated mail over SMTP: to SMTP_URL when set, otherwise to the local capture server. */
@Injectable()
export class MailService {
  private readonly logger = new Logger(MailService.name);
  private transport: Promise<Transporter> | undefined;

  constructor(
    private readonly config: ConfigService<Env, true>,
    private readonly templates: MailTemplates,
    private readonly localServer: LocalSmtpServer,
  ) {}

  /** Sends the message and resolves to its Message-ID once the SMTP server has accepted it. */
  async send(mail: OutgoingMail): Promise<string> {
    const rendered = this.templates.render(mail.template, mail.data);
    const transport = await this.getTransport();
    const info = await transport.sendMail({
      from: mail.sender ? senderFrom(this.config.get('MAIL_FROM', { infer: true }), mail.sender) : this.config.get('MAIL_FROM', { infer: true }),
      ...(mail.sender?.replyTo ? { replyTo: mail.sender.replyTo } : {}),
      to: mail.to,
      cc: mail.cc,
      subject: rendered.subject,
      html: rendered.html,
      text: rendered.text,
      headers: mail.companyId ? { 'X-Loamline-Company': mail.companyId } : {},
      attachments: mail.attachments,
    });
    this.logger.log(`sent "${mail.template}" mail ${info.messageId}`);
    return info.messageId;
  }

  private getTransport(): Promise<Transporter> {
    this.transport ??= (async () => {
      // nodemailer waits two minutes for a connection by default; a queued send should fail fast and retry.
      const timeouts = {
        connectionTimeout: this.config.get('SMTP_CONNECTION_TIMEOUT_MS', { infer: true }),
        greetingTimeout: this.config.get('SMTP_GREETING_TIMEOUT_MS', { infer: true }),
        socketTimeout: this.config.get('SMTP_SOCKET_TIMEOUT_MS', { infer: true }),
      };
      const url = this.config.get('SMTP_URL', { infer: true });
      if (url) return nodemailer.createTransport({ url, ...timeouts });
      const port = await this.localServer.port();
      return nodemailer.createTransport({ host: '127.0.0.1', port, secure: false, ignoreTLS: true, ...timeouts });
    })();
    return this.transport;
  }
}
