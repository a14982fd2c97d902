import { Body, Controller, Delete, Get, HttpCode, HttpStatus, Param, ParseUUIDPipe, Patch, Post, Req, Res } from '@nestjs/common';
import { ApiBearerAuth, ApiOperation, ApiParam, ApiTags } from '@nestjs/swagger';
import type { Request, Response } from 'express';

import { ApiContract, fileResponse } from '../common/api-contract.decorator.js';
import { type AuthUser, CurrentUser } from '../common/decorators/current-user.decorator.js';
import { ExpectedVersion } from '../common/decorators/expected-version.decorator.js';
import { Roles } from '../common/decorators/roles.decorator.js';
import { ZodValidationPipe } from '../common/zod-validation.pipe.js';
import {
  PHOTO_VARIANTS,
  type PhotoVariant,
  type PhotoWriteResponse,
  PhotoWriteResponseSchema,
  type UpdatePhotoInput,
  UpdatePhotoSchema,
} from '../domain/photos/photo.schema.js';
import { ApiJobVersion } from '../jobs/api-job-version.decorator.js';
import { photoNotFound } from './photo-errors.js';
import { PhotosService } from './photos.service.js';

const uuid = new ParseUUIDPipe();

/** One photo: its files, and changes that are versioned like every other write to its job. */
@ApiTags('photos')
@ApiBearerAuth()
@Roles('admin', 'office', 'lead', 'tech')
@Controller('photos/:id')
export class PhotosController {
  constructor(private readonly photos: PhotosService) {}

  @Get(':variant')
  @ApiOperation({ summary: 'Stream a photo file: thumb (320 px WebP), screen (1600 px WebP), print (2400 px JPEG), or original (staff)' })
  @ApiParam({ name: 'variant', enum: PHOTO_VARIANTS })
  @ApiContract({ responses: { 200: fileResponse('image/webp', 'image/jpeg', 'image/png') } })
  async file(
    @CurrentUser() user: AuthUser,
    @Param('id', uuid) id: string,
    @Param('variant') variant: string,
    @Req() req: Request,
    @Res() res: Response,
  ): Promise<void> {
    if (!(PHOTO_VARIANTS as readonly string[]).includes(variant)) throw photoNotFound();
    const content = await this.photos.open(user, id, variant as PhotoVariant);
    res.set({ ETag: content.etag, 'Cache-Control': 'private, max-age=86400', Vary: 'Authorization' });
    if (req.headers['if-none-match'] === content.etag) {
      content.stream.destroy();
      res.status(304).end();
      return;
    }
    res.set({ 'Content-Type': content.contentType, 'Content-Length': String(content.bytes) });
    if (variant === 'original') res.attachment(`photo-${id}.${content.contentType.split('/')[1] ?? 'bin'}`);
    content.stream.on('error', () => res.destroy());
    content.stream.pipe(res);
  }

  @Patch()
  @ApiJobVersion()
  @ApiOperation({ summary: 'Change a photo’s caption, taken-at, or what it shows (the job, an item, run or depth reading)' })
  @ApiContract({ body: UpdatePhotoSchema, responses: { 200: PhotoWriteResponseSchema } })
  update(
    @CurrentUser() user: AuthUser,
    @Param('id', uuid) id: string,
    @ExpectedVersion() version: number,
    @Body(new ZodValidationPipe(UpdatePhotoSchema)) body: UpdatePhotoInput,
  ): Promise<PhotoWriteResponse> {
    return this.photos.update(user, id, version, body);
  }

  @Delete()
  @ApiJobVersion()
  @ApiOperation({ summary: 'Soft-delete a photo (undo with POST /api/photos/:id/restore); its files are kept' })
  @ApiContract({ responses: { 200: PhotoWriteResponseSchema } })
  remove(@CurrentUser() user: AuthUser, @Param('id', uuid) id: string, @ExpectedVersion() version: number): Promise<PhotoWriteResponse> {
    return this.photos.remove(user, id, version);
  }

  @Post('restore')
  @HttpCode(HttpStatus.OK)
  @ApiJobVersion()
  @ApiOperation({ summary: 'Undo the deletion of a photo' })
  @ApiContract({ body: 'none', responses: { 200: PhotoWriteResponseSchema } })
  restore(@CurrentUser() user: AuthUser, @Param('id', uuid) id: string, @ExpectedVersion() version: number): Promise<PhotoWriteResponse> {
    return this.photos.restore(user, id, version);
  }
}
