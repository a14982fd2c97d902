import { Controller, Get, Param, ParseUUIDPipe, Res, StreamableFile } from '@nestjs/common';
import { ApiBearerAuth, ApiOperation, ApiTags } from '@nestjs/swagger';
import type { Response } from 'express';
import { z } from 'zod';

import { ApiContract, fileResponse } from '../common/api-contract.decorator.js';
import { type AuthUser, CurrentUser } from '../common/decorators/current-user.decorator.js';
import { Roles } from '../common/decorators/roles.decorator.js';
import type { PortalSiteDetailResponse, PortalSiteResponse } from '../domain/delivery/portal.schema.js';
import { PortalSiteResponseSchema, PortalSiteDetailResponseSchema } from '../domain/delivery/portal.schema.js';
import type { SiteMap } from '../domain/locate/site-map.schema.js';
import { SiteMapSchema } from '../domain/locate/site-map.schema.js';
import { sendPacketFile } from '../packets/packets.controller.js';
import { PortalService } from './portal.service.js';

/** The homeowner's portal (homeowners only; another's site or packet answers 404). Locate links: /api/sites/:siteId/locate-links. */
@ApiTags('portal')
@ApiBearerAuth()
@Roles('homeowner')
@Controller('portal')
export class PortalController {
  constructor(private readonly portal: PortalService) {}

  @Get('sites')
  @ApiOperation({ summary: 'The homeowner’s sites with the installer’s contact' })
  @ApiContract({ responses: { 200: z.array(PortalSiteResponseSchema) } })
  sites(@CurrentUser() user: AuthUser): Promise<PortalSiteResponse[]> {
    return this.portal.sites(user);
  }

  @Get('sites/:siteId')
  @ApiOperation({ summary: 'One site with every ready packet revision of every job there (newest first)' })
  @ApiContract({ responses: { 200: PortalSiteDetailResponseSchema } })
  site(@CurrentUser() user: AuthUser, @Param('siteId', ParseUUIDPipe) siteId: string): Promise<PortalSiteDetailResponse> {
    return this.portal.site(user, siteId);
  }

  @Get('sites/:siteId/map')
  @ApiOperation({ summary: 'The cumulative buried-cable map of the site (plan coordinates, and GeoJSON with a GPS origin)' })
  @ApiContract({ responses: { 200: SiteMapSchema } })
  map(@CurrentUser() user: AuthUser, @Param('siteId', ParseUUIDPipe) siteId: string): Promise<SiteMap> {
    return this.portal.map(user, siteId);
  }

  @Get('packets/:id/pdf')
  @ApiOperation({ summary: 'A revision’s PDF (SHA-256 checked; `Repr-Digest` and `ETag` carry it)' })
  @ApiContract({ responses: { 200: fileResponse('application/pdf') } })
  async pdf(@CurrentUser() user: AuthUser, @Param('id', ParseUUIDPipe) id: string, @Res({ passthrough: true }) res: Response): Promise<StreamableFile> {
    return sendPacketFile(res, await this.portal.file(user, id, 'pdf'));
  }

  @Get('packets/:id/archive.zip')
  @ApiOperation({ summary: 'A revision’s archive (SHA-256 checked)' })
  @ApiContract({ responses: { 200: fileResponse('application/zip') } })
  async archive(@CurrentUser() user: AuthUser, @Param('id', ParseUUIDPipe) id: string, @Res({ passthrough: true }) res: Response): Promise<StreamableFile> {
    return sendPacketFile(res, await this.portal.file(user, id, 'zip'));
  }
}
