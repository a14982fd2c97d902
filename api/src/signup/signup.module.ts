import { Module } from '@nestjs/common';

import { AuthModule } from '../auth/auth.module.js';
import { OutgoingMailModule } from '../outgoing-mail/outgoing-mail.module.js';
import { SignupController } from './signup.controller.js';
import { SignupRepository } from './signup.repository.js';
import { SignupService } from './signup.service.js';

/** Company sign-up (issue 14): a public request, a verification e-mail through the account-mail queue, and the link that creates the company. */
@Module({
  imports: [AuthModule, OutgoingMailModule],
  controllers: [SignupController],
  providers: [SignupService, SignupRepository],
})
export class SignupModule {}
