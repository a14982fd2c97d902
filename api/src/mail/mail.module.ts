import { Global, Module } from '@nestjs/common';

import { LinkBuilder } from './link-builder.js';
import { LocalSmtpServer } from './local-smtp.server.js';
import { MailCaptureRepository } from './mail-capture.repository.js';
import { MailTemplates } from './mail-templates.js';
import { MailService } from './mail.service.js';
import { OutboxController } from './outbox.controller.js';
import { OutboxService } from './outbox.service.js';

@Global()
@Module({
  controllers: [OutboxController],
  providers: [MailService, MailTemplates, LocalSmtpServer, MailCaptureRepository, OutboxService, LinkBuilder],
  exports: [MailService, LinkBuilder, LocalSmtpServer],
})
export class MailModule {}
