import { Controller, Delete, Get, Param, ParseUUIDPipe, Put, Req, Res, UploadedFile, UseInterceptors } from '@nestjs/common';
import { FileInterceptor } from '@nestjs/platform-express';
import { ApiBearerAuth, ApiOperation, ApiResponse, ApiTags } from '@nestjs/swagger';
import type { Request, Response } from 'express';

import { ApiContract, fileResponse, multipartBody } from '../common/api-contract.decorator.js';
import { type AuthUser, CurrentUser } from '../common/decorators/current-user.decorator.js';
import { ExpectedVersion } from '../common/decorators/expected-version.decorator.js';
import { Roles } from '../common/decorators/roles.decorator.js';
import { UploadSlotInterceptor } from '../common/image-work.js';
import type { SiteVersionResponse } from '../domain/sites/site-rules.js';
import {
  PLAN_IMAGE_MAX_BYTES,
  type PlanImageUploadResponse,
  PlanImageUploadResponseSchema,
  type SiteResponse,
  SiteResponseSchema,
  SiteVersionResponseSchema,
} from '../domain/sites/site.schema.js';
import { ApiSiteVersion } from './api-site-version.decorator.js';
import { PlanImageUploadInterceptor } from './plan-image-upload.interceptor.js';
import { SitePlanImagesService, type UploadedPlanFile } from './site-plan-images.service.js';

/**
 * The site-plan image: the office or a crew lead uploads a scan or photo of the drawing, the office
 * calibrates it (PATCH /api/sites/:id { planCalibration }), and every drawing of the site's jobs
 * draws on top of it.
 */
@ApiTags('sites')
@ApiBearerAuth()
@Controller('sites/:siteId/plan-image')
export class SitePlanImageController {
  constructor(private readonly planImages: SitePlanImagesService) {}

  @Put()
  @Roles('admin', 'office', 'lead')
  @ApiOperation({
    summary: 'Upload or replace the site-plan image (JPEG, PNG or WebP, sniffed from the bytes, at most 20 MB)',
    description:
      'Stored upright without metadata, longest side at most 4000 px (PNG stays PNG, anything else becomes JPEG). ' +
      'Replacing the image clears the calibration, whose pixel points no longer apply: `wasCalibrationCleared` says so.',
  })
  @ApiResponse({ status: 413, description: 'Larger than 20 MB, more pixels than UPLOAD_MAX_INPUT_PIXELS, or a side over UPLOAD_MAX_IMAGE_SIDE_PX' })
  @ApiResponse({ status: 415, description: 'Not a JPEG, PNG or WebP image (HEIC included)' })
  @ApiResponse({ status: 422, description: 'An image more elongated than UPLOAD_MAX_ASPECT_RATIO (IMAGE_TOO_ELONGATED)' })
  @ApiResponse({ status: 429, description: 'UPLOAD_MAX_CONCURRENT_PER_USER uploads of this user already in flight (TOO_MANY_UPLOADS, with Retry-After)' })
  // Outermost first: the per-user slot is taken before Multer reads the body; the next sees Multer's errors.
  @UseInterceptors(UploadSlotInterceptor, PlanImageUploadInterceptor, FileInterceptor('file', { limits: { fileSize: PLAN_IMAGE_MAX_BYTES, files: 1, fields: 10 } }))
  @ApiSiteVersion()
  @ApiContract({ body: multipartBody({ file: 'one' }), responses: { 200: PlanImageUploadResponseSchema.extend(SiteVersionResponseSchema.shape) } })
  upload(
    @CurrentUser() user: AuthUser,
    @Param('siteId', ParseUUIDPipe) siteId: string,
    @ExpectedVersion('site') expectedVersion: number,
    @UploadedFile() file: UploadedPlanFile | undefined,
  ): Promise<PlanImageUploadResponse & SiteVersionResponse> {
    return this.planImages.upload(user, siteId, expectedVersion, file);
  }

  @Get()
  @Roles('admin', 'office', 'lead', 'tech', 'homeowner')
  @ApiOperation({ summary: 'The site-plan image (staff of the company; a homeowner for their own sites)' })
  @ApiContract({ responses: { 200: fileResponse('image/jpeg', 'image/png', 'image/webp') } })
  async file(@CurrentUser() user: AuthUser, @Param('siteId', ParseUUIDPipe) siteId: string, @Req() req: Request, @Res() res: Response): Promise<void> {
    const content = await this.planImages.open(user, siteId);
    // Revalidated on every use: the URL carries ?v=, but the same site may get a new image.
    res.set({ ETag: content.etag, 'Cache-Control': 'private, max-age=0, must-revalidate', Vary: 'Authorization' });
    if (req.headers['if-none-match'] === content.etag) {
      res.status(304).end();
      return;
    }
    res.set({ 'Content-Type': content.contentType, 'Content-Length': String(content.body.length), 'X-Content-Type-Options': 'nosniff' });
    res.end(content.body);
  }

  @Delete()
  @Roles('admin', 'office', 'lead')
  @ApiOperation({ summary: 'Remove the site-plan image and its calibration' })
  @ApiSiteVersion()
  @ApiContract({ responses: { 200: SiteResponseSchema.extend(SiteVersionResponseSchema.shape) } })
  remove(
    @CurrentUser() user: AuthUser,
    @Param('siteId', ParseUUIDPipe) siteId: string,
    @ExpectedVersion('site') expectedVersion: number,
  ): Promise<SiteResponse & SiteVersionResponse> {
    return this.planImages.remove(user, siteId, expectedVersion);
  }
}
