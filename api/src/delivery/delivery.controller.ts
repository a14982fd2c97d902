import { Body, Controller, Get, HttpCode, HttpStatus, Param, ParseUUIDPipe, Post } from '@nestjs/common';
import { ApiBearerAuth, ApiOperation, ApiResponse, ApiTags } from '@nestjs/swagger';

import { type AuthUser, CurrentUser } from '../common/decorators/current-user.decorator.js';
import { Roles } from '../common/decorators/roles.decorator.js';
import { ZodValidationPipe } from '../common/zod-validation.pipe.js';
import {
  type PacketDeliveryResponse,
  type SendPacketInput,
  SendPacketSchema,
  type SendPacketResponse,
} from '../domain/delivery/delivery.schema.js';
import { DeliveryService } from './delivery.service.js';

@ApiTags('packets')
@ApiBearerAuth()
@Roles('admin', 'office')
@Controller('packets/:id')
export class DeliveryController {
  constructor(private readonly deliveries: DeliveryService) {}

  @Post('send')
  @HttpCode(HttpStatus.ACCEPTED)
  @ApiOperation({
    summary: 'E-mail a ready revision to the site’s homeowner(s) (queued; poll GET /api/packets/:id/deliveries)',
    description:
      'Without `to`: every homeowner linked to (or invited for) the site. With `to`: that person, linked to the site as its ' +
      'homeowner, or invited to the portal when they have no account (linked when they accept).',
  })
  @ApiResponse({ status: 409, description: '`PACKET_NOT_READY` or `RECIPIENT_NOT_HOMEOWNER`' })
  @ApiResponse({ status: 422, description: '`NO_RECIPIENT`: the site has no homeowner and no `to` was given' })
  send(
    @CurrentUser() user: AuthUser,
    @Param('id', ParseUUIDPipe) id: string,
    @Body(new ZodValidationPipe(SendPacketSchema)) body: SendPacketInput,
  ): Promise<SendPacketResponse> {
    return this.deliveries.send(user, id, body);
  }

  @Get('deliveries')
  @ApiOperation({ summary: 'The revision’s delivery log, newest first' })
  list(@CurrentUser() user: AuthUser, @Param('id', ParseUUIDPipe) id: string): Promise<PacketDeliveryResponse[]> {
    return this.deliveries.list(user, id);
  }
}
