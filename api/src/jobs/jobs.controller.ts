import {
  Body,
  Controller,
  Delete,
  Get,
  Headers,
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
import { ApiBearerAuth, ApiOperation, ApiResponse, ApiTags } from '@nestjs/swagger';
import type { Response } from 'express';

import { ApiContract, emptyResponse } from '../common/api-contract.decorator.js';
import { ContentEtagInterceptor, isNotModified, setEtagHeaders } from '../common/content-etag.js';
import { type AuthUser, CurrentUser } from '../common/decorators/current-user.decorator.js';
import { ExpectedVersion } from '../common/decorators/expected-version.decorator.js';
import { Roles } from '../common/decorators/roles.decorator.js';
import { ZodValidationPipe } from '../common/zod-validation.pipe.js';
import {
  type ChangeJobStatusInput,
  ChangeJobStatusSchema,
  type CreateJobInput,
  CreateJobSchema,
  JobAsBuiltResponseSchema,
  type JobListQuery,
  JobListQuerySchema,
  type JobListResponse,
  JobListResponseSchema,
  type JobResponse,
  JobResponseSchema,
  type UpdateJobInput,
  UpdateJobSchema,
} from '../domain/jobs/job.schema.js';
import { ApiJobVersion } from './api-job-version.decorator.js';
import { JobsService } from './jobs.service.js';

@ApiTags('jobs')
@ApiBearerAuth()
@Roles('admin', 'office', 'lead', 'tech')
@Controller('jobs')
export class JobsController {
  constructor(private readonly jobsService: JobsService) {}

  @Get()
  @ApiOperation({
    summary: 'List the company’s jobs, a page at a time',
    description:
      '`q` searches title, site label, address, city and customer name; `status` is one status, a comma-separated ' +
      'list or the parameter repeated; `sort` is updatedAt|title|status|startDate|site|customer, prefixed with - for descending (default -updatedAt); ' +
      '`page` from 1 or `cursor` (the `nextCursor` of the page before, read in the same `sort`: steady while jobs are added or removed); ' +
      '`pageSize` up to 100 (default 25); `mine=true` keeps jobs you lead or are assigned to.',
  })
  @ApiContract({ query: JobListQuerySchema, responses: { 200: JobListResponseSchema } })
  list(@CurrentUser() user: AuthUser, @Query(new ZodValidationPipe(JobListQuerySchema)) query: JobListQuery): Promise<JobListResponse> {
    return this.jobsService.list(user, query);
  }

  @Post()
  @Roles('admin', 'office')
  @ApiOperation({ summary: 'Create a draft job on a site' })
  @ApiContract({ body: CreateJobSchema, responses: { 201: JobResponseSchema } })
  create(@CurrentUser() user: AuthUser, @Body(new ZodValidationPipe(CreateJobSchema)) body: CreateJobInput): Promise<JobResponse> {
    return this.jobsService.create(user, body);
  }

  @Get(':id')
  @UseInterceptors(ContentEtagInterceptor)
  @ApiOperation({ summary: 'One job', description: 'Answers with an `ETag`; `If-None-Match` with it answers 304 while the job is unchanged.' })
  @ApiContract({ responses: { 200: JobResponseSchema } })
  get(@CurrentUser() user: AuthUser, @Param('id', ParseUUIDPipe) id: string): Promise<JobResponse> {
    return this.jobsService.get(user, id);
  }

  @Get(':id/as-built')
  @ApiOperation({
    summary: 'The whole as-built of a job with its analysis, in one response',
    description:
      '`asBuilt` follows the as-built contract (ids are the database uuids); `analysis` is the engineering analysis of it; ' +
      '`records` adds the ids of depth readings and the amplifier channel setups. Answers with an `ETag`; ' +
      '`If-None-Match` with it answers 304 while nothing the answer shows has changed.',
  })
  @ApiResponse({ status: 304, description: 'Not modified (If-None-Match named the current ETag)' })
  @ApiContract({ responses: { 200: JobAsBuiltResponseSchema } })
  async asBuilt(
    @CurrentUser() user: AuthUser,
    @Param('id', ParseUUIDPipe) id: string,
    @Headers('if-none-match') ifNoneMatch: string | undefined,
    @Res() res: Response,
  ): Promise<void> {
    // The answer is spliced from UTF-8 JSON kept in the as-built cache (see JobsService.asBuiltAnswer).
    const answer = await this.jobsService.asBuiltAnswer(user, id);
    setEtagHeaders(res, answer.etag);
    if (isNotModified(ifNoneMatch, answer.etag)) {
      res.status(304).end();
      return;
    }
    res.type('application/json').send(answer.body);
  }

  @Patch(':id')
  @Roles('admin', 'office', 'lead')
  @ApiJobVersion()
  @ApiOperation({ summary: 'Change a job’s details (office); a crew lead on the job may change its notes' })
  @ApiContract({ body: UpdateJobSchema, responses: { 200: JobResponseSchema } })
  update(
    @CurrentUser() user: AuthUser,
    @Param('id', ParseUUIDPipe) id: string,
    @ExpectedVersion() expectedVersion: number,
    @Body(new ZodValidationPipe(UpdateJobSchema)) body: UpdateJobInput,
  ): Promise<JobResponse> {
    return this.jobsService.update(user, id, expectedVersion, body);
  }

  @Delete(':id')
  @Roles('admin', 'office')
  @HttpCode(HttpStatus.NO_CONTENT)
  @ApiJobVersion()
  @ApiOperation({ summary: 'Delete a draft job and its whole record' })
  @ApiContract({ responses: { 204: emptyResponse } })
  async remove(
    @CurrentUser() user: AuthUser,
    @Param('id', ParseUUIDPipe) id: string,
    @ExpectedVersion() expectedVersion: number,
  ): Promise<void> {
    await this.jobsService.remove(user, id, expectedVersion);
  }

  @Post(':id/status')
  @Roles('admin', 'office', 'lead')
  @HttpCode(HttpStatus.OK)
  @ApiJobVersion()
  @ApiOperation({
    summary: 'Move a job through its statuses',
    description:
      'Crew lead (on their job) or office: draft → in_progress → submitted. Office/admin: submitted → ready_to_issue; ' +
      'submitted or ready_to_issue → in_progress (send back; `comment` required); issued → in_progress (reopen: the next ' +
      'revision). `issued` is set by issuing a packet, not here.',
  })
  @ApiResponse({ status: 400, description: 'A send-back without `comment` (issues name the field)' })
  @ApiContract({ body: ChangeJobStatusSchema, responses: { 200: JobResponseSchema } })
  changeStatus(
    @CurrentUser() user: AuthUser,
    @Param('id', ParseUUIDPipe) id: string,
    @ExpectedVersion() expectedVersion: number,
    @Body(new ZodValidationPipe(ChangeJobStatusSchema)) body: ChangeJobStatusInput,
  ): Promise<JobResponse> {
    return this.jobsService.changeStatus(user, id, expectedVersion, body);
  }
}
