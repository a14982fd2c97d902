import { Body, Controller, Get, HttpCode, HttpStatus, Param, ParseUUIDPipe, Post } from '@nestjs/common';
import { ApiBearerAuth, ApiOperation, ApiResponse, ApiTags } from '@nestjs/swagger';
import { z } from 'zod';

import { ApiContract } from '../common/api-contract.decorator.js';
import { type AuthUser, CurrentUser } from '../common/decorators/current-user.decorator.js';
import { Roles } from '../common/decorators/roles.decorator.js';
import { ZodValidationPipe } from '../common/zod-validation.pipe.js';
import {
  type DeliveryInContext,
  DeliveryInContextSchema,
  type PacketDeliveryResponse,
  PacketDeliveryResponseSchema,
  type SendOptionsResponse,
  SendOptionsResponseSchema,
  type SendPacketParsed,
  type SendPacketResponse,
  SendPacketResponseSchema,
  SendPacketSchema,
} from '../domain/delivery/delivery.schema.js';
import { DeliveryService } from './delivery.service.js';

/** Sending a revision and its delivery log: admin and office only. */
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
      'Without `to`: every homeowner linked to (or invited for) the site. With `to` (one address or a list): each is linked to ' +
      'the site as its homeowner, or invited to the portal when they have no account — the invitation link goes in the ' +
      'packet e-mail. `pdf`: `attached` (default; link only when the PDF is over MAIL_MAX_ATTACHMENT_BYTES) or `link`.',
  })
  @ApiResponse({ status: 409, description: '`PACKET_NOT_READY` or `RECIPIENT_NOT_HOMEOWNER` (naming `to.<n>`)' })
  @ApiResponse({ status: 422, description: '`NO_RECIPIENT`: the site has no homeowner and no `to` was given' })
  @ApiContract({ body: SendPacketSchema, responses: { 202: SendPacketResponseSchema } })
  send(
    @CurrentUser() user: AuthUser,
    @Param('id', ParseUUIDPipe) id: string,
    @Body(new ZodValidationPipe(SendPacketSchema)) body: SendPacketParsed,
  ): Promise<SendPacketResponse> {
    return this.deliveries.send(user, id, body);
  }

  @Get('send-options')
  @ApiOperation({ summary: 'What the send dialog starts from: the site’s homeowners and whether the PDF fits as an attachment' })
  @ApiContract({ responses: { 200: SendOptionsResponseSchema } })
  sendOptions(@CurrentUser() user: AuthUser, @Param('id', ParseUUIDPipe) id: string): Promise<SendOptionsResponse> {
    return this.deliveries.sendOptions(user, id);
  }

  @Get('deliveries')
  @ApiOperation({ summary: 'The revision’s delivery log, newest first' })
  @ApiContract({ responses: { 200: z.array(PacketDeliveryResponseSchema) } })
  list(@CurrentUser() user: AuthUser, @Param('id', ParseUUIDPipe) id: string): Promise<PacketDeliveryResponse[]> {
    return this.deliveries.list(user, id);
  }
}

/** Deliveries across revisions: a job's log, the failures waiting for the office, send again, dismiss. */
@ApiTags('packets')
@ApiBearerAuth()
@Roles('admin', 'office')
@Controller()
export class DeliveriesController {
  constructor(private readonly deliveries: DeliveryService) {}

  @Get('jobs/:jobId/deliveries')
  @ApiOperation({ summary: 'Every packet e-mail of the job (all revisions), newest first' })
  @ApiContract({ responses: { 200: z.array(DeliveryInContextSchema) } })
  listForJob(@CurrentUser() user: AuthUser, @Param('jobId', ParseUUIDPipe) jobId: string): Promise<DeliveryInContext[]> {
    return this.deliveries.listForJob(user, jobId);
  }

  @Get('deliveries/failed')
  @ApiOperation({ summary: 'Packet e-mails that failed and were neither sent again nor dismissed, newest first' })
  @ApiContract({ responses: { 200: z.array(DeliveryInContextSchema) } })
  failed(@CurrentUser() user: AuthUser): Promise<DeliveryInContext[]> {
    return this.deliveries.openFailures(user);
  }

  @Post('deliveries/:id/resend')
  @HttpCode(HttpStatus.ACCEPTED)
  @ApiOperation({ summary: 'Send a delivery again: a failed one is queued again; a sent one is sent once more as a new delivery' })
  @ApiResponse({ status: 409, description: '`DELIVERY_IN_PROGRESS` (queued or sending) or `PACKET_NOT_READY`' })
  @ApiContract({ body: 'none', responses: { 202: PacketDeliveryResponseSchema } })
  resend(@CurrentUser() user: AuthUser, @Param('id', ParseUUIDPipe) id: string): Promise<PacketDeliveryResponse> {
    return this.deliveries.resend(user, id);
  }

  @Post('deliveries/:id/dismiss')
  @HttpCode(HttpStatus.OK)
  @ApiOperation({ summary: 'Set a failed delivery aside (it stays in the log, no longer asking for attention)' })
  @ApiResponse({ status: 409, description: '`DELIVERY_NOT_FAILED`' })
  @ApiContract({ body: 'none', responses: { 200: PacketDeliveryResponseSchema } })
  dismiss(@CurrentUser() user: AuthUser, @Param('id', ParseUUIDPipe) id: string): Promise<PacketDeliveryResponse> {
    return this.deliveries.dismiss(user, id);
  }
}
