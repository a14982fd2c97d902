import { Controller, Get, Param, ParseUUIDPipe, Query, Res, StreamableFile } from '@nestjs/common';
import { ApiBearerAuth, ApiOperation, ApiTags } from '@nestjs/swagger';
import type { Response } from 'express';

import { ApiContract, fileResponse } from '../common/api-contract.decorator.js';
import { type AuthUser, CurrentUser } from '../common/decorators/current-user.decorator.js';
import { Roles } from '../common/decorators/roles.decorator.js';
import { ZodValidationPipe } from '../common/zod-validation.pipe.js';
import {
  type OutboxListResponse,
  OutboxListResponseSchema,
  type OutboxMessageResponse,
  OutboxMessageResponseSchema,
  type OutboxQuery,
  OutboxQuerySchema,
} from '../domain/mail/outbox.schema.js';
import type { MailStatusResponse } from '../domain/signup/signup.schema.js';
import { MailStatusResponseSchema } from '../domain/signup/signup.schema.js';
import { OutboxService } from './outbox.service.js';

@ApiTags('outbox')
@ApiBearerAuth()
@Roles('admin', 'office')
@Controller('outbox')
export class OutboxController {
  constructor(private readonly outboxService: OutboxService) {}

  @Get('status')
  @ApiOperation({ summary: 'Where mail goes: captured by the built-in server (read it here) or a mail service' })
  @ApiContract({ responses: { 200: MailStatusResponseSchema } })
  status(): MailStatusResponse {
    return this.outboxService.status();
  }

  @Get()
  @ApiOperation({ summary: "Messages captured by the local mail server for the caller's company (when SMTP_URL is not set)" })
  @ApiContract({ query: OutboxQuerySchema, responses: { 200: OutboxListResponseSchema } })
  list(
    @CurrentUser() user: AuthUser,
    @Query(new ZodValidationPipe(OutboxQuerySchema)) query: OutboxQuery,
  ): Promise<OutboxListResponse> {
    return this.outboxService.list(user, query);
  }

  @Get(':id')
  @ApiContract({ responses: { 200: OutboxMessageResponseSchema } })
  get(@CurrentUser() user: AuthUser, @Param('id', ParseUUIDPipe) id: string): Promise<OutboxMessageResponse> {
    return this.outboxService.get(user, id);
  }

  @Get(':id/attachments/:attachmentId')
  @ApiContract({ responses: { 200: fileResponse('*/*') } })
  async attachment(
    @CurrentUser() user: AuthUser,
    @Param('id', ParseUUIDPipe) id: string,
    @Param('attachmentId', ParseUUIDPipe) attachmentId: string,
    @Res({ passthrough: true }) res: Response,
  ): Promise<StreamableFile> {
    const attachment = await this.outboxService.attachment(user, id, attachmentId);
    res.setHeader('Content-Type', attachment.contentType);
    res.setHeader('Content-Disposition', `attachment; filename="${attachment.filename.replace(/["\\\r\n]/g, '_')}"`);
    return new StreamableFile(attachment.content);
  }
}
