import { Body, Controller, Delete, Get, HttpCode, HttpStatus, Param, ParseUUIDPipe, Patch, Post, Query } from '@nestjs/common';
import { ApiBearerAuth, ApiOperation, ApiTags } from '@nestjs/swagger';

import { type AuthUser, CurrentUser } from '../common/decorators/current-user.decorator.js';
import { Roles } from '../common/decorators/roles.decorator.js';
import { ZodValidationPipe } from '../common/zod-validation.pipe.js';
import {
  type CreateReferencePointInput,
  CreateReferencePointSchema,
  type CreateSiteInput,
  CreateSiteSchema,
  type LinkHomeownerInput,
  LinkHomeownerSchema,
  type ReferencePointResponse,
  type SiteListQuery,
  SiteListQuerySchema,
  type SiteResponse,
  type SiteSummaryResponse,
  type UpdateReferencePointInput,
  UpdateReferencePointSchema,
  type UpdateSiteInput,
  UpdateSiteSchema,
} from '../domain/sites/site.schema.js';
import { SitesService } from './sites.service.js';

/**
 * Staff read sites; the office creates and changes them and links homeowners; crew leads also record
 * reference points (they tape them on site).
 */
@ApiTags('sites')
@ApiBearerAuth()
@Roles('admin', 'office', 'lead', 'tech')
@Controller('sites')
export class SitesController {
  constructor(private readonly sitesService: SitesService) {}

  @Get()
  list(@CurrentUser() user: AuthUser, @Query(new ZodValidationPipe(SiteListQuerySchema)) query: SiteListQuery): Promise<SiteSummaryResponse[]> {
    return this.sitesService.list(user, query);
  }

  @Post()
  @Roles('admin', 'office')
  create(@CurrentUser() user: AuthUser, @Body(new ZodValidationPipe(CreateSiteSchema)) body: CreateSiteInput): Promise<SiteResponse> {
    return this.sitesService.create(user, body);
  }

  @Get(':id')
  @ApiOperation({ summary: 'A site with its reference points, linked homeowners and job history' })
  get(@CurrentUser() user: AuthUser, @Param('id', ParseUUIDPipe) id: string): Promise<SiteResponse> {
    return this.sitesService.get(user, id);
  }

  @Patch(':id')
  @ApiOperation({ summary: 'Change a site (a crew lead: only planCalibration and northAzimuthDeg)' })
  @Roles('admin', 'office', 'lead')
  update(
    @CurrentUser() user: AuthUser,
    @Param('id', ParseUUIDPipe) id: string,
    @Body(new ZodValidationPipe(UpdateSiteSchema)) body: UpdateSiteInput,
  ): Promise<SiteResponse> {
    return this.sitesService.update(user, id, body);
  }

  @Delete(':id')
  @Roles('admin', 'office')
  @HttpCode(HttpStatus.NO_CONTENT)
  async remove(@CurrentUser() user: AuthUser, @Param('id', ParseUUIDPipe) id: string): Promise<void> {
    await this.sitesService.remove(user, id);
  }

  @Post(':siteId/reference-points')
  @Roles('admin', 'office', 'lead')
  createReferencePoint(
    @CurrentUser() user: AuthUser,
    @Param('siteId', ParseUUIDPipe) siteId: string,
    @Body(new ZodValidationPipe(CreateReferencePointSchema)) body: CreateReferencePointInput,
  ): Promise<ReferencePointResponse> {
    return this.sitesService.createReferencePoint(user, siteId, body);
  }

  @Patch(':siteId/reference-points/:pointId')
  @Roles('admin', 'office', 'lead')
  updateReferencePoint(
    @CurrentUser() user: AuthUser,
    @Param('siteId', ParseUUIDPipe) siteId: string,
    @Param('pointId', ParseUUIDPipe) pointId: string,
    @Body(new ZodValidationPipe(UpdateReferencePointSchema)) body: UpdateReferencePointInput,
  ): Promise<ReferencePointResponse> {
    return this.sitesService.updateReferencePoint(user, siteId, pointId, body);
  }

  @Delete(':siteId/reference-points/:pointId')
  @Roles('admin', 'office', 'lead')
  @HttpCode(HttpStatus.NO_CONTENT)
  async deleteReferencePoint(
    @CurrentUser() user: AuthUser,
    @Param('siteId', ParseUUIDPipe) siteId: string,
    @Param('pointId', ParseUUIDPipe) pointId: string,
  ): Promise<void> {
    await this.sitesService.deleteReferencePoint(user, siteId, pointId);
  }

  @Post(':siteId/homeowners')
  @Roles('admin', 'office')
  @ApiOperation({ summary: 'Let a homeowner account see this site' })
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
  async unlinkHomeowner(
    @CurrentUser() user: AuthUser,
    @Param('siteId', ParseUUIDPipe) siteId: string,
    @Param('userId', ParseUUIDPipe) userId: string,
  ): Promise<void> {
    await this.sitesService.unlinkHomeowner(user, siteId, userId);
  }
}
