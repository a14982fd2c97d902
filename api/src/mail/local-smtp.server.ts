import type { AddressInfo } from 'node:net';

import { Injectable, Logger, type OnApplicationBootstrap, type OnApplicationShutdown } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { simpleParser } from 'mailparser';
import { SMTPServer } from 'smtp-server';

import { type Env, mailDestination } from '../config/env.schema.js';
import { MailCaptureRepository } from './mail-capture.repository.js';

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/**
 * The local stand-in for a hosted mail service: a real SMTP server on 127.0.0.1 that stores every
 * message it receives (headers, HTML, text, attachments) for the Outbox page. It runs whenever no
 * SMTP_URL is configured, whatever NODE_ENV is: mail that works out of the box, read in the app.
 */
@Injectable()
export class LocalSmtpServer implements OnApplicationBootstrap, OnApplicationShutdown {
  private readonly logger = new Logger(LocalSmtpServer.name);
  private server: SMTPServer | undefined;
  private listening: Promise<number> | undefined;

  constructor(
    private readonly config: ConfigService<Env, true>,
    private readonly repository: MailCaptureRepository,
  ) {}

  get isEnabled(): boolean {
    return !this.config.get('SMTP_URL', { infer: true });
  }

  /** Starts the server on first use and resolves to the port it listens on. */
  port(): Promise<number> {
    this.listening ??= new Promise<number>((resolve, reject) => {
      const server = new SMTPServer({
        authOptional: true,
        disabledCommands: ['STARTTLS', 'AUTH'],
        size: 50 * 1024 * 1024,
        logger: false,
        onData: (stream, _session, callback) => {
          simpleParser(stream)
            .then((parsed) => this.store(parsed))
            .then(() => callback())
            .catch((error: Error) => {
              this.logger.error(`could not store a captured message: ${error.message}`);
              callback(error);
            });
        },
      });
      server.on('error', (error) => this.logger.warn(`local SMTP server: ${error.message}`));
      server.server.once('error', reject);
      server.listen(this.config.get('LOCAL_SMTP_PORT', { infer: true }), '127.0.0.1', () => {
        const { port } = server.server.address() as AddressInfo;
        this.logger.log(`local SMTP capture server on 127.0.0.1:${port}`);
        resolve(port);
      });
      this.server = server;
    });
    return this.listening;
  }

  async onApplicationBootstrap(): Promise<void> {
    if (this.isEnabled) {
      await this.port();
      this.logger.log('mail is captured locally: read it on the Outbox page (set SMTP_URL to deliver it)');
    } else {
      this.logger.log(`mail goes to ${mailDestination(this.config.get('SMTP_URL', { infer: true }))}`);
    }
  }

  async onApplicationShutdown(): Promise<void> {
    const server = this.server;
    if (server) await new Promise<void>((resolve) => server.close(() => resolve()));
  }

  private async store(parsed: Awaited<ReturnType<typeof simpleParser>>): Promise<void> {
    const header = (name: string) => {
      const value = parsed.headers.get(name);
      return typeof value === 'string' ? value : undefined;
    };
    const addresses = (field: typeof parsed.to) =>
      (Array.isArray(field) ? field : field ? [field] : []).flatMap((a) => a.value.map((v) => v.address ?? ''));
    const companyId = header('x-loamline-company');
    const headers: Record<string, string> = {};
    for (const line of parsed.headerLines) headers[line.key] = line.line.slice(line.key.length + 1).trim();
    await this.repository.insert({
      companyId: companyId && UUID.test(companyId) ? companyId : null,
      messageId: parsed.messageId ?? null,
      fromAddress: parsed.from?.text ?? '',
      toAddresses: [...addresses(parsed.to), ...addresses(parsed.cc)].filter(Boolean),
      subject: parsed.subject ?? '',
      text: parsed.text ?? null,
      html: typeof parsed.html === 'string' ? parsed.html : null,
      headers,
      sizeBytes: (parsed.text?.length ?? 0) + (typeof parsed.html === 'string' ? parsed.html.length : 0),
      attachments: parsed.attachments.map((a) => ({
        filename: a.filename ?? 'attachment',
        contentType: a.contentType,
        content: a.content,
      })),
    });
  }
}
