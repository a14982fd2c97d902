import { Body, Controller, Param, ParseUUIDPipe, Post } from '@nestjs/common';
import { ApiBearerAuth, ApiOperation, ApiResponse, ApiTags } from '@nestjs/swagger';

import { ApiContract } from '../common/api-contract.decorator.js';
import { type AuthUser, CurrentUser } from '../common/decorators/current-user.decorator.js';
import { Roles } from '../common/decorators/roles.decorator.js';
import { ZodValidationPipe } from '../common/zod-validation.pipe.js';
import type { InvitationResponse } from '../domain/auth/auth.schema.js';
import { InvitationResponseSchema } from '../domain/auth/auth.schema.js';
import { type InviteHomeownerInput, InviteHomeownerSchema } from '../domain/sites/homeowner-invitation.schema.js';
import { SiteHomeownersService } from './site-homeowners.service.js';

@ApiTags('sites')
@ApiBearerAuth()
@Roles('admin', 'office')
@Controller('sites/:siteId/homeowner-invitations')
export class SiteHomeownersController {
  constructor(private readonly homeowners: SiteHomeownersService) {}

  @Post()
  @ApiOperation({
    summary: 'Invite a homeowner to the portal by e-mail; the site is linked to their account when they accept',
    description: 'An existing account with that e-mail is refused (409 EMAIL_TAKEN): link it with POST /api/sites/:siteId/homeowners instead.',
  })
  @ApiResponse({ status: 409, description: '`EMAIL_TAKEN`: someone already has an account with this e-mail' })
  @ApiContract({ body: InviteHomeownerSchema, responses: { 201: InvitationResponseSchema } })
  invite(
    @CurrentUser() user: AuthUser,
    @Param('siteId', ParseUUIDPipe) siteId: string,
    @Body(new ZodValidationPipe(InviteHomeownerSchema)) body: InviteHomeownerInput,
  ): Promise<InvitationResponse> {
    return this.homeowners.invite(user, siteId, body);
  }
}
