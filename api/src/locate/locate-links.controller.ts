import { Body, Controller, Delete, Get, HttpCode, HttpStatus, Param, ParseUUIDPipe, Post, UseInterceptors } from '@nestjs/common';
import { ApiBearerAuth, ApiOperation, ApiTags } from '@nestjs/swagger';
import { z } from 'zod';

import { ApiContract, emptyResponse } from '../common/api-contract.decorator.js';
import { type AuthUser, CurrentUser } from '../common/decorators/current-user.decorator.js';
import { Roles } from '../common/decorators/roles.decorator.js';
import { ZodValidationPipe } from '../common/zod-validation.pipe.js';
import {
  type CreatedLocateLinkResponse,
  CreatedLocateLinkResponseSchema,
  type CreateLocateLinkInput,
  CreateLocateLinkSchema,
  type LocateLinkResponse,
  LocateLinkResponseSchema,
} from '../domain/locate/locate-link.schema.js';
import { LocateLinksService } from './locate-links.service.js';
import { NoStoreInterceptor } from './no-store.interceptor.js';

/** Locate links of a site: the office for any company site, a homeowner for the sites linked to them. */
@ApiTags('locate links')
@ApiBearerAuth()
@Roles('admin', 'office', 'homeowner')
@Controller()
export class LocateLinksController {
  constructor(private readonly locateLinks: LocateLinksService) {}

  @Post('sites/:siteId/locate-links')
  @HttpCode(HttpStatus.CREATED)
  // The answer carries the token: not to be cached anywhere.
  @UseInterceptors(NoStoreInterceptor)
  @ApiOperation({ summary: 'Make a locate link; the answer carries its URL with the token, shown this once' })
  @ApiContract({ body: CreateLocateLinkSchema, responses: { 201: CreatedLocateLinkResponseSchema } })
  create(
    @CurrentUser() user: AuthUser,
    @Param('siteId', ParseUUIDPipe) siteId: string,
    @Body(new ZodValidationPipe(CreateLocateLinkSchema)) body: CreateLocateLinkInput,
  ): Promise<CreatedLocateLinkResponse> {
    return this.locateLinks.create(user, siteId, body);
  }

  @Get('sites/:siteId/locate-links')
  @ApiOperation({ summary: 'The site’s locate links, newest first, with open count and last open' })
  @ApiContract({ responses: { 200: z.array(LocateLinkResponseSchema) } })
  list(@CurrentUser() user: AuthUser, @Param('siteId', ParseUUIDPipe) siteId: string): Promise<LocateLinkResponse[]> {
    return this.locateLinks.list(user, siteId);
  }

  @Delete('locate-links/:id')
  @HttpCode(HttpStatus.NO_CONTENT)
  @ApiOperation({ summary: 'Revoke a locate link (idempotent); it answers 404 from then on' })
  @ApiContract({ responses: { 204: emptyResponse } })
  async revoke(@CurrentUser() user: AuthUser, @Param('id', ParseUUIDPipe) id: string): Promise<void> {
    await this.locateLinks.revoke(user, id);
  }
}
