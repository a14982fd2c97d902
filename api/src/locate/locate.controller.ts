import { Controller, Get, Param, ParseUUIDPipe, Req, Res, StreamableFile, UseGuards, UseInterceptors } from '@nestjs/common';
import { ApiOperation, ApiParam, ApiResponse, ApiTags } from '@nestjs/swagger';
import type { Request, Response } from 'express';

import { ApiContract, fileResponse } from '../common/api-contract.decorator.js';
import { Public } from '../common/decorators/public.decorator.js';
import type { LocateViewResponse } from '../domain/locate/locate-link.schema.js';
import { LocateViewResponseSchema } from '../domain/locate/locate-link.schema.js';
import { LocateThrottlerGuard } from './locate-throttler.guard.js';
import { type LocateClient, LocateService } from './locate.service.js';
import { NoStoreInterceptor } from './no-store.interceptor.js';

function clientOf(req: Request): LocateClient {
  return { ip: req.ip ?? null, userAgent: req.get('user-agent') ?? null };
}

/**
 * The public locate view (no account): whoever holds a link's token reads the site's buried-cable map.
 * Rate-limited per client address; unknown, expired and revoked tokens answer 404
 * `LOCATE_LINK_NOT_VALID` and count towards a stricter limit (then 429).
 */
@ApiTags('locate')
@Public()
@UseGuards(LocateThrottlerGuard)
@UseInterceptors(NoStoreInterceptor)
@Controller('locate/:token')
export class LocateController {
  constructor(private readonly locate: LocateService) {}

  @Get()
  @ApiOperation({ summary: 'The locate view: site, installer, cautions, cumulative map, runs with depths and photos (each open is logged)' })
  @ApiResponse({ status: 404, description: '`LOCATE_LINK_NOT_VALID`: unknown, expired or revoked' })
  @ApiResponse({ status: 429, description: 'Too many requests, or too many invalid tokens, from this address' })
  @ApiContract({ responses: { 200: LocateViewResponseSchema } })
  view(@Param('token') token: string, @Req() req: Request): Promise<LocateViewResponse> {
    return this.locate.view(token, clientOf(req));
  }

  @Get('map.geojson')
  @ApiOperation({ summary: 'The cumulative map as an RFC 7946 GeoJSON download (404 `SITE_NOT_GEOREFERENCED` without a GPS origin)' })
  @ApiContract({ responses: { 200: fileResponse('application/geo+json') } })
  async geojson(@Param('token') token: string, @Req() req: Request, @Res({ passthrough: true }) res: Response): Promise<StreamableFile> {
    const { geojson, fileName } = await this.locate.geojson(token, clientOf(req));
    res.setHeader('Content-Type', 'application/geo+json');
    res.setHeader('Content-Disposition', `attachment; filename="${fileName}"`);
    return new StreamableFile(Buffer.from(`${JSON.stringify(geojson, null, 2)}\n`, 'utf8'));
  }

  @Get('sheet.pdf')
  @ApiOperation({ summary: 'The one-page printable locate sheet (PDF): map with scale bar and ties, runs with depths, locate steps, cautions, installer' })
  @ApiResponse({ status: 404, description: '`LOCATE_LINK_NOT_VALID`: unknown, expired or revoked' })
  @ApiContract({ responses: { 200: fileResponse('application/pdf') } })
  async sheet(@Param('token') token: string, @Req() req: Request, @Res({ passthrough: true }) res: Response): Promise<StreamableFile> {
    const { pdf, fileName } = await this.locate.sheet(token, clientOf(req));
    res.setHeader('Content-Type', 'application/pdf');
    res.setHeader('Content-Disposition', `inline; filename="${fileName}"`);
    return new StreamableFile(pdf);
  }

  @Get('runs/:runId/depth-profile.svg')
  @ApiOperation({ summary: 'One run’s depth profile (SVG), drawn from the issued revision' })
  @ApiContract({ responses: { 200: fileResponse('image/svg+xml') } })
  async depthProfile(
    @Param('token') token: string,
    // A run id as the issued snapshot has it (not necessarily a uuid); unknown ids answer 404.
    @Param('runId') runId: string,
    @Req() req: Request,
    @Res({ passthrough: true }) res: Response,
  ): Promise<StreamableFile> {
    const svg = await this.locate.depthProfile(token, runId, clientOf(req));
    res.setHeader('Content-Type', 'image/svg+xml; charset=utf-8');
    return new StreamableFile(Buffer.from(svg, 'utf8'));
  }

  @Get('photos/:photoId/:variant')
  @ApiParam({ name: 'variant', enum: ['thumb', 'screen'] })
  @ApiOperation({ summary: 'A trench photo of the site, metadata stripped (`thumb` or `screen` only)' })
  @ApiContract({ responses: { 200: fileResponse('image/webp', 'image/jpeg', 'image/png') } })
  async photo(
    @Param('token') token: string,
    @Param('photoId', ParseUUIDPipe) photoId: string,
    @Param('variant') variant: string,
    @Req() req: Request,
    @Res({ passthrough: true }) res: Response,
  ): Promise<StreamableFile> {
    const photo = await this.locate.photo(token, photoId, variant, clientOf(req));
    res.setHeader('Content-Type', photo.contentType);
    return new StreamableFile(photo.body);
  }
}
