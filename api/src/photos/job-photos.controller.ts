import { Body, Controller, Get, Param, ParseUUIDPipe, Post, Query, Res, UploadedFiles, UseInterceptors } from '@nestjs/common';
import { FilesInterceptor } from '@nestjs/platform-express';
import { ApiBearerAuth, ApiOperation, ApiResponse, ApiTags } from '@nestjs/swagger';
import type { Response } from 'express';

import { ApiContract, multipartBody } from '../common/api-contract.decorator.js';
import { type AuthUser, CurrentUser } from '../common/decorators/current-user.decorator.js';
import { ExpectedVersion } from '../common/decorators/expected-version.decorator.js';
import { Roles } from '../common/decorators/roles.decorator.js';
import { UploadSlotInterceptor } from '../common/image-work.js';
import { ZodValidationPipe } from '../common/zod-validation.pipe.js';
import {
  PhotoListQuerySchema,
  type PhotoListResponse,
  PhotoListResponseSchema,
  type UploadPhotosFields,
  UploadPhotosFieldsSchema,
  type UploadPhotosResponse,
  UploadPhotosResponseSchema,
} from '../domain/photos/photo.schema.js';
import { ApiJobVersion } from '../jobs/api-job-version.decorator.js';
import { PhotosService, type UploadedPhotoFile } from './photos.service.js';
import { UploadLimitsInterceptor } from './upload-limits.interceptor.js';

const uuid = new ParseUUIDPipe();

/** Photos of one job: the evidence behind its as-built (open trench with a tape, wall entries, the rack). */
@ApiTags('photos')
@ApiBearerAuth()
@Roles('admin', 'office', 'lead', 'tech')
@Controller('jobs/:jobId/photos')
export class JobPhotosController {
  constructor(private readonly photos: PhotosService) {}

  @Get()
  @ApiOperation({ summary: 'The job’s photos (oldest first) with captions, targets, taken-at and derivative URLs' })
  @ApiContract({ query: PhotoListQuerySchema, responses: { 200: PhotoListResponseSchema } })
  list(@CurrentUser() user: AuthUser, @Param('jobId', uuid) jobId: string, @Query('includeDeleted') includeDeleted?: string): Promise<PhotoListResponse> {
    return this.photos.list(user, jobId, { includeDeleted: includeDeleted === 'true' });
  }

  @Post()
  @ApiJobVersion()
  @ApiOperation({
    summary:
      'Upload photos (JPEG, PNG or WebP, sniffed from the bytes) to the job or one of its items, runs or depth readings. ' +
      'Send the job version as If-Match. Answers 201, or 200 with isReplay when every clientUploadId was stored already.',
  })
  @ApiResponse({
    status: 413,
    description: 'A file exceeds UPLOAD_MAX_FILE_BYTES, or more than UPLOAD_MAX_FILES files, or an image over UPLOAD_MAX_INPUT_PIXELS or UPLOAD_MAX_IMAGE_SIDE_PX.',
  })
  @ApiResponse({ status: 415, description: 'Not a JPEG, PNG or WebP image (HEIC: send JPEG, the camera’s most compatible format).' })
  @ApiResponse({ status: 422, description: 'An image more elongated than UPLOAD_MAX_ASPECT_RATIO (IMAGE_TOO_ELONGATED).' })
  @ApiResponse({ status: 429, description: 'UPLOAD_MAX_CONCURRENT_PER_USER uploads of this user already in flight (TOO_MANY_UPLOADS, with Retry-After).' })
  // Outermost first: the per-user slot is taken before Multer buffers the body, and the limits
  // interceptor sees Multer's errors.
  @UseInterceptors(UploadSlotInterceptor, UploadLimitsInterceptor, FilesInterceptor('files'))
  @ApiContract({ body: multipartBody({ files: 'many' }, UploadPhotosFieldsSchema), responses: { 201: UploadPhotosResponseSchema, 200: UploadPhotosResponseSchema } })
  async upload(
    @CurrentUser() user: AuthUser,
    @Param('jobId', uuid) jobId: string,
    @ExpectedVersion() version: number,
    @Body(new ZodValidationPipe(UploadPhotosFieldsSchema)) fields: UploadPhotosFields,
    @UploadedFiles() files: UploadedPhotoFile[] | undefined,
    @Res({ passthrough: true }) res: Response,
  ): Promise<UploadPhotosResponse> {
    const result = await this.photos.upload(user, jobId, version, fields, files ?? []);
    res.status(result.isReplay ? 200 : 201);
    return result;
  }
}
