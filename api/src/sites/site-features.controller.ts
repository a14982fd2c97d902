import { Body, Controller, Delete, Get, Param, ParseUUIDPipe, Patch, Post } from '@nestjs/common';
import { ApiBearerAuth, ApiOperation, ApiTags } from '@nestjs/swagger';
import { z } from 'zod';

import { ApiContract } from '../common/api-contract.decorator.js';
import { type AuthUser, CurrentUser } from '../common/decorators/current-user.decorator.js';
import { ExpectedVersion } from '../common/decorators/expected-version.decorator.js';
import { Roles } from '../common/decorators/roles.decorator.js';
import { ZodValidationPipe } from '../common/zod-validation.pipe.js';
import {
  type CreateSiteFeatureInput,
  CreateSiteFeatureSchema,
  type SiteFeatureResponse,
  SiteFeatureResponseSchema,
  type UpdateSiteFeatureInput,
  UpdateSiteFeatureSchema,
} from '../domain/sites/site-feature.schema.js';
import type { SiteVersionResponse } from '../domain/sites/site-rules.js';
import { SiteVersionResponseSchema } from '../domain/sites/site.schema.js';
import { ApiSiteVersion } from './api-site-version.decorator.js';
import { SiteFeaturesService } from './site-features.service.js';

/**
 * Site features (house footprint, fences, walls, patios, paths, pools, spas, driveways, trees, beds):
 * staff read them; the office, and crew leads on an open job's crew, draw them. Every change names the
 * site version (If-Match) like the site's other geometry.
 */
@ApiTags('sites')
@ApiBearerAuth()
@Roles('admin', 'office', 'lead', 'tech')
@Controller('sites/:siteId/features')
export class SiteFeaturesController {
  constructor(private readonly features: SiteFeaturesService) {}

  @Get()
  @ApiOperation({ summary: 'The site’s features (landmarks), in drawing order' })
  @ApiContract({ responses: { 200: z.array(SiteFeatureResponseSchema) } })
  list(@CurrentUser() user: AuthUser, @Param('siteId', ParseUUIDPipe) siteId: string): Promise<SiteFeatureResponse[]> {
    return this.features.list(user, siteId);
  }

  @Post()
  @Roles('admin', 'office', 'lead')
  @ApiSiteVersion()
  @ApiOperation({ summary: 'Add a named outline or line to the site plan' })
  @ApiContract({ body: CreateSiteFeatureSchema, responses: { 201: SiteFeatureResponseSchema.extend(SiteVersionResponseSchema.shape) } })
  create(
    @CurrentUser() user: AuthUser,
    @Param('siteId', ParseUUIDPipe) siteId: string,
    @ExpectedVersion('site') expectedVersion: number,
    @Body(new ZodValidationPipe(CreateSiteFeatureSchema)) body: CreateSiteFeatureInput,
  ): Promise<SiteFeatureResponse & SiteVersionResponse> {
    return this.features.create(user, siteId, expectedVersion, body);
  }

  @Patch(':featureId')
  @Roles('admin', 'office', 'lead')
  @ApiSiteVersion()
  @ApiOperation({ summary: 'Rename, reclassify or reshape a feature' })
  @ApiContract({ body: UpdateSiteFeatureSchema, responses: { 200: SiteFeatureResponseSchema.extend(SiteVersionResponseSchema.shape) } })
  update(
    @CurrentUser() user: AuthUser,
    @Param('siteId', ParseUUIDPipe) siteId: string,
    @Param('featureId', ParseUUIDPipe) featureId: string,
    @ExpectedVersion('site') expectedVersion: number,
    @Body(new ZodValidationPipe(UpdateSiteFeatureSchema)) body: UpdateSiteFeatureInput,
  ): Promise<SiteFeatureResponse & SiteVersionResponse> {
    return this.features.update(user, siteId, featureId, expectedVersion, body);
  }

  @Delete(':featureId')
  @Roles('admin', 'office', 'lead')
  @ApiSiteVersion()
  @ApiOperation({ summary: 'Delete a feature; answers with the site’s new version' })
  @ApiContract({ responses: { 200: SiteVersionResponseSchema } })
  remove(
    @CurrentUser() user: AuthUser,
    @Param('siteId', ParseUUIDPipe) siteId: string,
    @Param('featureId', ParseUUIDPipe) featureId: string,
    @ExpectedVersion('site') expectedVersion: number,
  ): Promise<SiteVersionResponse> {
    return this.features.remove(user, siteId, featureId, expectedVersion);
  }
}
