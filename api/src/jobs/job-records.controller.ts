import { Body, Controller, Delete, Param, ParseUUIDPipe, Patch, Post, Put } from '@nestjs/common';
import { ApiBearerAuth, ApiOperation, ApiTags } from '@nestjs/swagger';

import { ApiContract } from '../common/api-contract.decorator.js';
import { type AuthUser, CurrentUser } from '../common/decorators/current-user.decorator.js';
import { ExpectedVersion } from '../common/decorators/expected-version.decorator.js';
import { Roles } from '../common/decorators/roles.decorator.js';
import { ZodValidationPipe } from '../common/zod-validation.pipe.js';
import {
  type ChannelSetup,
  ChannelSetupSchema,
  type ChannelSetupWriteResponse,
  ChannelSetupWriteResponseSchema,
  type CheckInput,
  CheckInputSchema,
  type CheckWriteResponse,
  CheckWriteResponseSchema,
  type DepthReadingInput,
  DepthReadingInputSchema,
  type DepthReadingWriteResponse,
  DepthReadingWriteResponseSchema,
  type ItemInput,
  ItemInputSchema,
  type ItemWriteResponse,
  ItemWriteResponseSchema,
  type RunInput,
  RunInputSchema,
  type RunWriteResponse,
  RunWriteResponseSchema,
  type UpdateDepthReadingInput,
  UpdateDepthReadingSchema,
  type ZoneInput,
  ZoneInputSchema,
  type ZoneWriteResponse,
  ZoneWriteResponseSchema,
} from '../domain/jobs/job-record.schema.js';
import { type JobVersionResponse, JobVersionResponseSchema } from '../domain/jobs/job.schema.js';
import { ApiJobVersion } from './api-job-version.decorator.js';
import { JobRecordsService } from './job-records.service.js';

const uuid = new ParseUUIDPipe();

/**
 * The parts of a job's as-built. Bodies are the as-built contract's shapes without `id` (the server
 * assigns uuids); every write names the job version it builds on (If-Match or `expectedVersion`) and
 * answers with the job's new version as `jobVersion`. Crew leads and the office record; technicians may
 * also write depth readings and commissioning checks.
 */
@ApiTags('job records')
@ApiBearerAuth()
@ApiJobVersion()
@Roles('admin', 'office', 'lead')
@Controller('jobs/:jobId')
export class JobRecordsController {
  constructor(private readonly records: JobRecordsService) {}

  @Post('zones')
  @ApiContract({ body: ZoneInputSchema, responses: { 201: ZoneWriteResponseSchema } })
  createZone(
    @CurrentUser() user: AuthUser,
    @Param('jobId', uuid) jobId: string,
    @ExpectedVersion() version: number,
    @Body(new ZodValidationPipe(ZoneInputSchema)) body: ZoneInput,
  ): Promise<ZoneWriteResponse> {
    return this.records.createZone(user, jobId, version, body);
  }

  @Patch('zones/:zoneId')
  @ApiContract({ body: ZoneInputSchema, responses: { 200: ZoneWriteResponseSchema } })
  updateZone(
    @CurrentUser() user: AuthUser,
    @Param('jobId', uuid) jobId: string,
    @Param('zoneId', uuid) zoneId: string,
    @ExpectedVersion() version: number,
    @Body(new ZodValidationPipe(ZoneInputSchema)) body: ZoneInput,
  ): Promise<ZoneWriteResponse> {
    return this.records.updateZone(user, jobId, zoneId, version, body);
  }

  @Delete('zones/:zoneId')
  @ApiOperation({ summary: 'Delete a zone; its items stay, without a zone' })
  @ApiContract({ responses: { 200: JobVersionResponseSchema } })
  deleteZone(
    @CurrentUser() user: AuthUser,
    @Param('jobId', uuid) jobId: string,
    @Param('zoneId', uuid) zoneId: string,
    @ExpectedVersion() version: number,
  ): Promise<JobVersionResponse> {
    return this.records.deleteZone(user, jobId, zoneId, version);
  }

  @Post('items')
  @ApiOperation({ summary: 'Add an equipment item (any kind: amplifier with channels, speaker, subwoofer, junction, spare end, wall entry)' })
  @ApiContract({ body: ItemInputSchema, responses: { 201: ItemWriteResponseSchema } })
  createItem(
    @CurrentUser() user: AuthUser,
    @Param('jobId', uuid) jobId: string,
    @ExpectedVersion() version: number,
    @Body(new ZodValidationPipe(ItemInputSchema)) body: ItemInput,
  ): Promise<ItemWriteResponse> {
    return this.records.createItem(user, jobId, version, body);
  }

  @Put('items/:itemId')
  @ApiOperation({ summary: 'Replace an item; amplifier channels sent with their id are kept, channels left out are deleted' })
  @ApiContract({ body: ItemInputSchema, responses: { 200: ItemWriteResponseSchema } })
  replaceItem(
    @CurrentUser() user: AuthUser,
    @Param('jobId', uuid) jobId: string,
    @Param('itemId', uuid) itemId: string,
    @ExpectedVersion() version: number,
    @Body(new ZodValidationPipe(ItemInputSchema)) body: ItemInput,
  ): Promise<ItemWriteResponse> {
    return this.records.replaceItem(user, jobId, itemId, version, body);
  }

  @Delete('items/:itemId')
  @ApiOperation({ summary: 'Delete an item (refused with 409 IN_USE while a run or check uses it)' })
  @ApiContract({ responses: { 200: JobVersionResponseSchema } })
  deleteItem(
    @CurrentUser() user: AuthUser,
    @Param('jobId', uuid) jobId: string,
    @Param('itemId', uuid) itemId: string,
    @ExpectedVersion() version: number,
  ): Promise<JobVersionResponse> {
    return this.records.deleteItem(user, jobId, itemId, version);
  }

  @Put('items/:itemId/channels/:channelId/setup')
  @ApiOperation({ summary: 'Record how an amplifier channel was set up (source, gain, limits, EQ, crossover …; never passwords)' })
  @ApiContract({ body: ChannelSetupSchema, responses: { 200: ChannelSetupWriteResponseSchema } })
  updateChannelSetup(
    @CurrentUser() user: AuthUser,
    @Param('jobId', uuid) jobId: string,
    @Param('itemId', uuid) itemId: string,
    @Param('channelId', uuid) channelId: string,
    @ExpectedVersion() version: number,
    @Body(new ZodValidationPipe(ChannelSetupSchema)) body: ChannelSetup,
  ): Promise<ChannelSetupWriteResponse> {
    return this.records.updateChannelSetup(user, jobId, itemId, channelId, version, body);
  }

  @Post('runs')
  @ApiOperation({ summary: 'Add a run (cable between two items) with its pairs, route and optional depth readings' })
  @ApiContract({ body: RunInputSchema, responses: { 201: RunWriteResponseSchema } })
  createRun(
    @CurrentUser() user: AuthUser,
    @Param('jobId', uuid) jobId: string,
    @ExpectedVersion() version: number,
    @Body(new ZodValidationPipe(RunInputSchema)) body: RunInput,
  ): Promise<RunWriteResponse> {
    return this.records.createRun(user, jobId, version, body);
  }

  @Put('runs/:runId')
  @ApiOperation({ summary: 'Replace a run; its depth readings are replaced only when the body lists them' })
  @ApiContract({ body: RunInputSchema, responses: { 200: RunWriteResponseSchema } })
  replaceRun(
    @CurrentUser() user: AuthUser,
    @Param('jobId', uuid) jobId: string,
    @Param('runId', uuid) runId: string,
    @ExpectedVersion() version: number,
    @Body(new ZodValidationPipe(RunInputSchema)) body: RunInput,
  ): Promise<RunWriteResponse> {
    return this.records.replaceRun(user, jobId, runId, version, body);
  }

  @Delete('runs/:runId')
  @ApiOperation({ summary: 'Delete a run of this job; a run an earlier job installed is recorded as removed by this job instead' })
  @ApiContract({ responses: { 200: JobVersionResponseSchema } })
  deleteRun(
    @CurrentUser() user: AuthUser,
    @Param('jobId', uuid) jobId: string,
    @Param('runId', uuid) runId: string,
    @ExpectedVersion() version: number,
  ): Promise<JobVersionResponse> {
    return this.records.deleteRun(user, jobId, runId, version);
  }

  @Delete('site-changes/:recordId')
  @ApiOperation({ summary: 'Undo this job’s change to an item or run an earlier job installed (changed, abandoned or removed)' })
  @ApiContract({ responses: { 200: JobVersionResponseSchema } })
  undoChange(
    @CurrentUser() user: AuthUser,
    @Param('jobId', uuid) jobId: string,
    @Param('recordId', uuid) recordId: string,
    @ExpectedVersion() version: number,
  ): Promise<JobVersionResponse> {
    return this.records.undoChange(user, jobId, recordId, version);
  }

  @Post('runs/:runId/depth-readings')
  @Roles('admin', 'office', 'lead', 'tech')
  @ApiOperation({ summary: 'Quick add: a depth reading (cover, metres) at a station (metres from the run’s from-end)' })
  @ApiContract({ body: DepthReadingInputSchema, responses: { 201: DepthReadingWriteResponseSchema } })
  addDepthReading(
    @CurrentUser() user: AuthUser,
    @Param('jobId', uuid) jobId: string,
    @Param('runId', uuid) runId: string,
    @ExpectedVersion() version: number,
    @Body(new ZodValidationPipe(DepthReadingInputSchema)) body: DepthReadingInput,
  ): Promise<DepthReadingWriteResponse> {
    return this.records.addDepthReading(user, jobId, runId, version, body);
  }

  @Patch('runs/:runId/depth-readings/:readingId')
  @Roles('admin', 'office', 'lead', 'tech')
  @ApiContract({ body: UpdateDepthReadingSchema, responses: { 200: DepthReadingWriteResponseSchema } })
  updateDepthReading(
    @CurrentUser() user: AuthUser,
    @Param('jobId', uuid) jobId: string,
    @Param('runId', uuid) runId: string,
    @Param('readingId', uuid) readingId: string,
    @ExpectedVersion() version: number,
    @Body(new ZodValidationPipe(UpdateDepthReadingSchema)) body: UpdateDepthReadingInput,
  ): Promise<DepthReadingWriteResponse> {
    return this.records.updateDepthReading(user, jobId, runId, readingId, version, body);
  }

  @Delete('runs/:runId/depth-readings/:readingId')
  @Roles('admin', 'office', 'lead', 'tech')
  @ApiContract({ responses: { 200: JobVersionResponseSchema } })
  deleteDepthReading(
    @CurrentUser() user: AuthUser,
    @Param('jobId', uuid) jobId: string,
    @Param('runId', uuid) runId: string,
    @Param('readingId', uuid) readingId: string,
    @ExpectedVersion() version: number,
  ): Promise<JobVersionResponse> {
    return this.records.deleteDepthReading(user, jobId, runId, readingId, version);
  }

  @Post('checks')
  @Roles('admin', 'office', 'lead', 'tech')
  @ApiOperation({ summary: 'Add a commissioning check (measured DC resistance or impedance of one channel)' })
  @ApiContract({ body: CheckInputSchema, responses: { 201: CheckWriteResponseSchema } })
  createCheck(
    @CurrentUser() user: AuthUser,
    @Param('jobId', uuid) jobId: string,
    @ExpectedVersion() version: number,
    @Body(new ZodValidationPipe(CheckInputSchema)) body: CheckInput,
  ): Promise<CheckWriteResponse> {
    return this.records.createCheck(user, jobId, version, body);
  }

  @Put('checks/:checkId')
  @Roles('admin', 'office', 'lead', 'tech')
  @ApiContract({ body: CheckInputSchema, responses: { 200: CheckWriteResponseSchema } })
  replaceCheck(
    @CurrentUser() user: AuthUser,
    @Param('jobId', uuid) jobId: string,
    @Param('checkId', uuid) checkId: string,
    @ExpectedVersion() version: number,
    @Body(new ZodValidationPipe(CheckInputSchema)) body: CheckInput,
  ): Promise<CheckWriteResponse> {
    return this.records.replaceCheck(user, jobId, checkId, version, body);
  }

  @Delete('checks/:checkId')
  @Roles('admin', 'office', 'lead', 'tech')
  @ApiContract({ responses: { 200: JobVersionResponseSchema } })
  deleteCheck(
    @CurrentUser() user: AuthUser,
    @Param('jobId', uuid) jobId: string,
    @Param('checkId', uuid) checkId: string,
    @ExpectedVersion() version: number,
  ): Promise<JobVersionResponse> {
    return this.records.deleteCheck(user, jobId, checkId, version);
  }
}
