import { Controller, Get, Headers, Param, ParseUUIDPipe, Query, Res } from '@nestjs/common';
import { ApiBearerAuth, ApiOperation, ApiTags } from '@nestjs/swagger';
import type { Response } from 'express';

import { ApiContract, fileResponse } from '../common/api-contract.decorator.js';
import { type AuthUser, CurrentUser } from '../common/decorators/current-user.decorator.js';
import { Roles } from '../common/decorators/roles.decorator.js';
import { ZodValidationPipe } from '../common/zod-validation.pipe.js';
import {
  type DrawingQuery,
  DrawingQuerySchema,
  type SitePlanDrawingQuery,
  SitePlanDrawingQuerySchema,
} from '../domain/jobs/job-drawings.schema.js';
import { type DrawingAnswer, JobDrawingsService } from './job-drawings.service.js';

const uuid = new ParseUUIDPipe();

/**
 * An SVG file holds our own markup and, at most, the plan image as a data: URL. Opened on its own in a
 * browser it may run nothing and load nothing else. Each answer carries the drawing's ETag and is
 * revalidated on every use (`no-cache`): a client that sends it back in `If-None-Match` gets a 304
 * while the job, its site and the query are unchanged.
 */
function sendSvg(res: Response, answer: DrawingAnswer, fileName: string): void {
  res.set({ ETag: answer.etag, 'Cache-Control': 'private, no-cache', Vary: 'Authorization' });
  if (answer.isNotModified) {
    res.status(304).end();
    return;
  }
  res.set({
    'Content-Type': 'image/svg+xml; charset=utf-8',
    'Content-Security-Policy': "default-src 'none'; style-src 'unsafe-inline'; img-src data:",
    'Content-Disposition': `inline; filename="${fileName}"`,
    'X-Content-Type-Options': 'nosniff',
    'X-Drawing-Cache': answer.isCacheHit ? 'hit' : 'miss',
  });
  res.send(answer.svg);
}

@ApiTags('jobs')
@ApiBearerAuth()
@Roles('admin', 'office', 'lead', 'tech')
@Controller('jobs/:id/drawings')
export class JobDrawingsController {
  constructor(private readonly drawings: JobDrawingsService) {}

  @Get('site-plan.svg')
  @ApiOperation({ summary: 'The site plan of the current as-built, to scale on a Letter or A4 sheet, with the site’s calibrated plan image underneath' })
  @ApiContract({ query: SitePlanDrawingQuerySchema, responses: { 200: fileResponse('image/svg+xml') } })
  async sitePlan(
    @CurrentUser() user: AuthUser,
    @Param('id', uuid) id: string,
    @Query(new ZodValidationPipe(SitePlanDrawingQuerySchema)) query: SitePlanDrawingQuery,
    @Headers('if-none-match') ifNoneMatch: string | undefined,
    @Res() res: Response,
  ): Promise<void> {
    sendSvg(res, await this.drawings.sitePlan(user, id, query, ifNoneMatch), 'site-plan.svg');
  }

  @Get('schematic.svg')
  @ApiOperation({ summary: 'The wiring schematic of the current as-built: amplifier channels → runs → items, with the load per channel' })
  @ApiContract({ query: DrawingQuerySchema, responses: { 200: fileResponse('image/svg+xml') } })
  async schematic(
    @CurrentUser() user: AuthUser,
    @Param('id', uuid) id: string,
    @Query(new ZodValidationPipe(DrawingQuerySchema)) query: DrawingQuery,
    @Headers('if-none-match') ifNoneMatch: string | undefined,
    @Res() res: Response,
  ): Promise<void> {
    sendSvg(res, await this.drawings.schematic(user, id, query, ifNoneMatch), 'schematic.svg');
  }

  @Get('runs/:runId/depth-profile.svg')
  @ApiOperation({ summary: 'The depth profile of one run: readings along the trench against the rule minimum' })
  @ApiContract({ query: DrawingQuerySchema, responses: { 200: fileResponse('image/svg+xml') } })
  async depthProfile(
    @CurrentUser() user: AuthUser,
    @Param('id', uuid) id: string,
    @Param('runId', uuid) runId: string,
    @Query(new ZodValidationPipe(DrawingQuerySchema)) query: DrawingQuery,
    @Headers('if-none-match') ifNoneMatch: string | undefined,
    @Res() res: Response,
  ): Promise<void> {
    sendSvg(res, await this.drawings.depthProfile(user, id, runId, query, ifNoneMatch), `depth-profile-${runId}.svg`);
  }
}
