import {
  Body,
  Controller,
  Delete,
  Get,
  HttpCode,
  HttpStatus,
  Param,
  ParseUUIDPipe,
  Patch,
  Post,
  Query,
  Res,
  UseInterceptors,
} from '@nestjs/common';
import { ApiBearerAuth, ApiOperation, ApiTags } from '@nestjs/swagger';
import type { Response } from 'express';

import { ApiContract, emptyResponse } from '../common/api-contract.decorator.js';
import { ContentEtagInterceptor } from '../common/content-etag.js';
import { type AuthUser, CurrentUser } from '../common/decorators/current-user.decorator.js';
import { ExpectedVersion } from '../common/decorators/expected-version.decorator.js';
import { Roles } from '../common/decorators/roles.decorator.js';
import { ZodValidationPipe } from '../common/zod-validation.pipe.js';
import type { CursorPage } from '../domain/paging/page.schema.js';
import type { SiteVersionResponse } from '../domain/sites/site-rules.js';
import {
  type CreateReferencePointInput,
  CreateReferencePointSchema,
  type CreateSiteInput,
  CreateSiteSchema,
  HomeownerListResponseSchema,
  type LinkHomeownerInput,
  LinkHomeownerSchema,
  type ReferencePointResponse,
  ReferencePointResponseSchema,
  type SiteListQuery,
  SiteListQuerySchema,
  SitePageSchema,
  type SiteResponse,
  SiteResponseSchema,
  type SiteSummaryResponse,
  SiteVersionResponseSchema,
  type UpdateReferencePointInput,
  UpdateReferencePointSchema,
  type UpdateSiteInput,
  UpdateSiteSchema,
} from '../domain/sites/site.schema.js';
import { ApiSiteVersion } from './api-site-version.decorator.js';
import { SitesService } from './sites.service.js';

/**
 * Staff read sites; the office creates and changes them and links homeowners; crew leads on the crew of
 * an open job at the site also record reference points (they tape them on site) and set the plan's
 * frame. Every change names the site version it builds on (If-Match, SiteWriter); a change to the
 * site's plan or reference points is refused while a job on the site is under review, and bumps the
 * version of every open job on it.
 */
@ApiTags('sites')
@ApiBearerAuth()
@Roles('admin', 'office', 'lead', 'tech')
@Controller('sites')
export class SitesController {
  constructor(private readonly sitesService: SitesService) {}

  @Get()
  @ApiOperation({ summary: 'The company’s sites by label, a page at a time', description: '`q` searches label, address, city and customer; `customerId` keeps one customer’s; `page` from 1 or `cursor` (the `nextCursor` of the page before, steady while sites are added or removed), `pageSize` up to 100 (default 25).' })
  @ApiContract({ query: SiteListQuerySchema, responses: { 200: SitePageSchema } })
  list(@CurrentUser() user: AuthUser, @Query(new ZodValidationPipe(SiteListQuerySchema)) query: SiteListQuery): Promise<CursorPage<SiteSummaryResponse>> {
    return this.sitesService.list(user, query);
  }

  @Post()
  @Roles('admin', 'office')
  @ApiContract({ body: CreateSiteSchema, responses: { 201: SiteResponseSchema } })
  create(@CurrentUser() user: AuthUser, @Body(new ZodValidationPipe(CreateSiteSchema)) body: CreateSiteInput): Promise<SiteResponse> {
    return this.sitesService.create(user, body);
  }

  @Get(':id')
  @UseInterceptors(ContentEtagInterceptor)
  @ApiOperation({ summary: 'A site with its reference points, linked homeowners and job history' })
  @ApiContract({ responses: { 200: SiteResponseSchema } })
  async get(
    @CurrentUser() user: AuthUser,
    @Param('id', ParseUUIDPipe) id: string,
    @Res({ passthrough: true }) res: Response,
  ): Promise<SiteResponse> {
    const site = await this.sitesService.get(user, id);
    // The version as an entity tag, for If-Match; revalidated on every use (the site may change any time).
    res.set({ ETag: `"${site.version}"`, 'Cache-Control': 'no-store' });
    return site;
  }

  @Patch(':id')
  @ApiOperation({
    summary: 'Change a site (a crew lead on an open job there: only planCalibration and northAzimuthDeg)',
    description: 'northAzimuthDeg, origin and planCalibration are the site’s geometry: see If-Match below.',
  })
  @ApiSiteVersion()
  @Roles('admin', 'office', 'lead')
  @ApiContract({ body: UpdateSiteSchema, responses: { 200: SiteResponseSchema.extend(SiteVersionResponseSchema.shape) } })
  update(
    @CurrentUser() user: AuthUser,
    @Param('id', ParseUUIDPipe) id: string,
    @ExpectedVersion('site') expectedVersion: number,
    @Body(new ZodValidationPipe(UpdateSiteSchema)) body: UpdateSiteInput,
  ): Promise<SiteResponse & SiteVersionResponse> {
    return this.sitesService.update(user, id, expectedVersion, body);
  }

  @Delete(':id')
  @Roles('admin', 'office')
  @HttpCode(HttpStatus.NO_CONTENT)
  @ApiContract({ responses: { 204: emptyResponse } })
  async remove(@CurrentUser() user: AuthUser, @Param('id', ParseUUIDPipe) id: string): Promise<void> {
    await this.sitesService.remove(user, id);
  }

  @Post(':siteId/reference-points')
  @Roles('admin', 'office', 'lead')
  @ApiSiteVersion()
  @ApiContract({ body: CreateReferencePointSchema, responses: { 201: ReferencePointResponseSchema.extend(SiteVersionResponseSchema.shape) } })
  createReferencePoint(
    @CurrentUser() user: AuthUser,
    @Param('siteId', ParseUUIDPipe) siteId: string,
    @ExpectedVersion('site') expectedVersion: number,
    @Body(new ZodValidationPipe(CreateReferencePointSchema)) body: CreateReferencePointInput,
  ): Promise<ReferencePointResponse & SiteVersionResponse> {
    return this.sitesService.createReferencePoint(user, siteId, expectedVersion, body);
  }

  @Patch(':siteId/reference-points/:pointId')
  @Roles('admin', 'office', 'lead')
  @ApiSiteVersion()
  @ApiOperation({ summary: 'Move or rename a reference point: every item tied to it moves, on every open job of the site' })
  @ApiContract({ body: UpdateReferencePointSchema, responses: { 200: ReferencePointResponseSchema.extend(SiteVersionResponseSchema.shape) } })
  updateReferencePoint(
    @CurrentUser() user: AuthUser,
    @Param('siteId', ParseUUIDPipe) siteId: string,
    @Param('pointId', ParseUUIDPipe) pointId: string,
    @ExpectedVersion('site') expectedVersion: number,
    @Body(new ZodValidationPipe(UpdateReferencePointSchema)) body: UpdateReferencePointInput,
  ): Promise<ReferencePointResponse & SiteVersionResponse> {
    return this.sitesService.updateReferencePoint(user, siteId, pointId, expectedVersion, body);
  }

  @Delete(':siteId/reference-points/:pointId')
  @Roles('admin', 'office', 'lead')
  @ApiSiteVersion()
  @ApiOperation({ summary: 'Delete a reference point no item is tied to; answers with the site’s new version' })
  @ApiContract({ responses: { 200: SiteVersionResponseSchema } })
  deleteReferencePoint(
    @CurrentUser() user: AuthUser,
    @Param('siteId', ParseUUIDPipe) siteId: string,
    @Param('pointId', ParseUUIDPipe) pointId: string,
    @ExpectedVersion('site') expectedVersion: number,
  ): Promise<SiteVersionResponse> {
    return this.sitesService.deleteReferencePoint(user, siteId, pointId, expectedVersion);
  }

  @Post(':siteId/homeowners')
  @Roles('admin', 'office')
  @ApiOperation({ summary: 'Let a homeowner account see this site' })
  @ApiContract({ body: LinkHomeownerSchema, responses: { 201: HomeownerListResponseSchema } })
  linkHomeowner(
    @CurrentUser() user: AuthUser,
    @Param('siteId', ParseUUIDPipe) siteId: string,
    @Body(new ZodValidationPipe(LinkHomeownerSchema)) body: LinkHomeownerInput,
  ): Promise<SiteResponse['homeowners']> {
    return this.sitesService.linkHomeowner(user, siteId, body.userId);
  }

  @Delete(':siteId/homeowners/:userId')
  @Roles('admin', 'office')
  @HttpCode(HttpStatus.NO_CONTENT)
  @ApiContract({ responses: { 204: emptyResponse } })
  async unlinkHomeowner(
    @CurrentUser() user: AuthUser,
    @Param('siteId', ParseUUIDPipe) siteId: string,
    @Param('userId', ParseUUIDPipe) userId: string,
  ): Promise<void> {
    await this.sitesService.unlinkHomeowner(user, siteId, userId);
  }
}
