import { Body, Controller, Get, HttpCode, HttpStatus, Param, ParseUUIDPipe, Post, Res, StreamableFile } from '@nestjs/common';
import { ApiBearerAuth, ApiOperation, ApiResponse, ApiTags } from '@nestjs/swagger';
import type { Response } from 'express';
import { z } from 'zod';

import { ApiContract, fileResponse } from '../common/api-contract.decorator.js';
import { type AuthUser, CurrentUser } from '../common/decorators/current-user.decorator.js';
import { ExpectedVersion } from '../common/decorators/expected-version.decorator.js';
import { Roles } from '../common/decorators/roles.decorator.js';
import { ZodValidationPipe } from '../common/zod-validation.pipe.js';
import { type IssuePacketInput, IssuePacketInputSchema } from '../domain/packet/known-exceptions.js';
import { IssuePacketResponseSchema, PacketRevisionResponseSchema } from '../domain/packet/packet-revision.schema.js';
import { ApiJobVersion } from '../jobs/api-job-version.decorator.js';
import { type IssuePacketResponse, type PacketFile, type PacketRevisionResponse, PacketsService } from './packets.service.js';

/** Streams a verified packet file with its digest headers (the portal serves its downloads the same way). */
export function sendPacketFile(res: Response, file: PacketFile): StreamableFile {
  res.setHeader('Content-Type', file.contentType);
  res.setHeader('Content-Disposition', `attachment; filename="${file.fileName}"`);
  res.setHeader('ETag', `"${file.sha256}"`);
  // RFC 9530 representation digest (base64 of the SHA-256), verified against the record before sending.
  res.setHeader('Repr-Digest', `sha-256=:${Buffer.from(file.sha256, 'hex').toString('base64')}:`);
  res.setHeader('Cache-Control', 'private, max-age=0, must-revalidate');
  return new StreamableFile(file.body);
}

@ApiTags('packets')
@ApiBearerAuth()
@Roles('admin', 'office', 'lead', 'tech')
@Controller()
export class PacketsController {
  constructor(private readonly packets: PacketsService) {}

  @Post('jobs/:jobId/packets')
  @Roles('admin', 'office')
  @HttpCode(HttpStatus.CREATED)
  @ApiJobVersion()
  @ApiOperation({
    summary: 'Issue the job’s handover packet (the next revision)',
    description:
      'The job must be ready to issue. Freezes the as-built into revision N, moves the job to `issued` and queues the ' +
      'PDF render; poll GET /api/packets/:id until `status` is `ready` (or `failed` with `failureReason`). Every open ' +
      'must-fix finding needs an entry in `acknowledgements` ({ code, path, reason }, `path` joined with dots); ' +
      'acknowledged findings print as Known exceptions in the homeowner’s words.',
  })
  @ApiResponse({ status: 400, description: '`FINDINGS_NOT_ACKNOWLEDGED` (names the finding) or `VALIDATION_FAILED`' })
  @ApiResponse({ status: 409, description: '`JOB_NOT_READY_TO_ISSUE` or `PACKET_ALREADY_ISSUED`' })
  @ApiResponse({ status: 412, description: '`VERSION_CONFLICT`: the job changed since you read it (If-Match); body `currentVersion`' })
  @ApiContract({ body: IssuePacketInputSchema, responses: { 201: IssuePacketResponseSchema } })
  issue(
    @CurrentUser() user: AuthUser,
    @Param('jobId', ParseUUIDPipe) jobId: string,
    @ExpectedVersion() expectedVersion: number,
    @Body(new ZodValidationPipe(IssuePacketInputSchema)) body: IssuePacketInput,
  ): Promise<IssuePacketResponse> {
    return this.packets.issue(user, jobId, expectedVersion, body);
  }

  @Get('jobs/:jobId/packets')
  @ApiOperation({ summary: 'The job’s packet revisions, newest first, with their render status' })
  @ApiContract({ responses: { 200: z.array(PacketRevisionResponseSchema) } })
  list(@CurrentUser() user: AuthUser, @Param('jobId', ParseUUIDPipe) jobId: string): Promise<PacketRevisionResponse[]> {
    return this.packets.listForJob(user, jobId);
  }

  @Get('packets/:id')
  @ApiOperation({ summary: 'One packet revision and its render status' })
  @ApiContract({ responses: { 200: PacketRevisionResponseSchema } })
  get(@CurrentUser() user: AuthUser, @Param('id', ParseUUIDPipe) id: string): Promise<PacketRevisionResponse> {
    return this.packets.get(user, id);
  }

  @Get('packets/:id/pdf')
  @ApiOperation({ summary: 'The revision’s PDF (409 until ready); its SHA-256 is checked before sending' })
  @ApiContract({ responses: { 200: fileResponse('application/pdf') } })
  async pdf(@CurrentUser() user: AuthUser, @Param('id', ParseUUIDPipe) id: string, @Res({ passthrough: true }) res: Response): Promise<StreamableFile> {
    return sendPacketFile(res, await this.packets.file(user, id, 'pdf'));
  }

  @Get('packets/:id/archive.zip')
  @ApiOperation({ summary: 'The revision’s archive (PDF, drawings, CSV, JSON, GeoJSON, photos, MANIFEST.sha256)' })
  @ApiContract({ responses: { 200: fileResponse('application/zip') } })
  async archive(@CurrentUser() user: AuthUser, @Param('id', ParseUUIDPipe) id: string, @Res({ passthrough: true }) res: Response): Promise<StreamableFile> {
    return sendPacketFile(res, await this.packets.file(user, id, 'zip'));
  }
}
