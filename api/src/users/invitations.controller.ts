import { Body, Controller, Delete, Get, HttpCode, HttpStatus, Param, ParseUUIDPipe, Post } from '@nestjs/common';
import { ApiBearerAuth, ApiOperation, ApiTags } from '@nestjs/swagger';
import { z } from 'zod';

import { ApiContract, emptyResponse } from '../common/api-contract.decorator.js';
import { type AuthUser, CurrentUser } from '../common/decorators/current-user.decorator.js';
import { Roles } from '../common/decorators/roles.decorator.js';
import { ZodValidationPipe } from '../common/zod-validation.pipe.js';
import {
  type CreateInvitationInput,
  CreateInvitationSchema,
  type InvitationResponse,
  InvitationResponseSchema,
} from '../domain/auth/auth.schema.js';
import { UsersService } from './users.service.js';

@ApiTags('users')
@ApiBearerAuth()
@Roles('admin', 'office')
@Controller('invitations')
export class InvitationsController {
  constructor(private readonly usersService: UsersService) {}

  @Get()
  @ApiContract({ responses: { 200: z.array(InvitationResponseSchema) } })
  list(@CurrentUser() user: AuthUser): Promise<InvitationResponse[]> {
    return this.usersService.listInvitations(user);
  }

  @Post()
  @ApiContract({ body: CreateInvitationSchema, responses: { 201: InvitationResponseSchema } })
  create(
    @CurrentUser() user: AuthUser,
    @Body(new ZodValidationPipe(CreateInvitationSchema)) body: CreateInvitationInput,
  ): Promise<InvitationResponse> {
    return this.usersService.invite(user, body);
  }

  @Post(':id/resend')
  @HttpCode(HttpStatus.ACCEPTED)
  @ApiOperation({ summary: 'Queue the invitation e-mail again with a new link (the earlier link stops working)' })
  @ApiContract({ body: 'none', responses: { 202: InvitationResponseSchema } })
  resend(@CurrentUser() user: AuthUser, @Param('id', ParseUUIDPipe) id: string): Promise<InvitationResponse> {
    return this.usersService.resendInvitation(user, id);
  }

  @Delete(':id')
  @HttpCode(HttpStatus.NO_CONTENT)
  @ApiContract({ responses: { 204: emptyResponse } })
  async revoke(@CurrentUser() user: AuthUser, @Param('id', ParseUUIDPipe) id: string): Promise<void> {
    await this.usersService.revokeInvitation(user, id);
  }
}
