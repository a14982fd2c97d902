import { Module } from '@nestjs/common';

import { OutgoingMailModule } from '../outgoing-mail/outgoing-mail.module.js';
import { InvitationsController } from './invitations.controller.js';
import { UsersController } from './users.controller.js';
import { UsersRepository } from './users.repository.js';
import { UsersService } from './users.service.js';

@Module({
  imports: [OutgoingMailModule],
  controllers: [UsersController, InvitationsController],
  providers: [UsersService, UsersRepository],
  // Sending a packet to a homeowner without an account invites them through the same flow.
  exports: [UsersService],
})
export class UsersModule {}
