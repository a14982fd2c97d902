import { BadRequestException, Body, Controller, Delete, Get, Param, ParseUUIDPipe, type PipeTransform, Put } from '@nestjs/common';
import { ApiBearerAuth, ApiOperation, ApiTags } from '@nestjs/swagger';
import { z } from 'zod';

import { ApiContract } from '../common/api-contract.decorator.js';
import { type AuthUser, CurrentUser } from '../common/decorators/current-user.decorator.js';
import { ExpectedVersion } from '../common/decorators/expected-version.decorator.js';
import { Roles } from '../common/decorators/roles.decorator.js';
import { ZodValidationPipe } from '../common/zod-validation.pipe.js';
import { type JobVersionResponse, JobVersionResponseSchema } from '../domain/jobs/job.schema.js';
import {
  type JobSignatureResponse,
  JobSignatureResponseSchema,
  SIGNATURE_ROLES,
  type SignatureInput,
  SignatureInputSchema,
  type SignatureRole,
  type SignatureWriteResponse,
  SignatureWriteResponseSchema,
} from '../domain/packet/signature.schema.js';
import { ApiJobVersion } from '../jobs/api-job-version.decorator.js';
import { SignaturesService } from './signatures.service.js';

const uuid = new ParseUUIDPipe();

class ParseSignatureRolePipe implements PipeTransform<string, SignatureRole> {
  transform(value: string): SignatureRole {
    if ((SIGNATURE_ROLES as readonly string[]).includes(value)) return value as SignatureRole;
    throw new BadRequestException({
      message: 'role: must be lead or homeowner',
      code: 'VALIDATION_FAILED',
      issues: [{ path: 'role', message: 'must be lead or homeowner' }],
    });
  }
}

/**
 * The sign-off block's signatures, captured on the lead's device at the walkthrough before the packet is
 * issued; issuing copies them into the revision (a revision issued without them says in one line that the walkthrough was not signed).
 */
@ApiTags('packets')
@ApiBearerAuth()
@Roles('admin', 'office', 'lead')
@Controller('jobs/:jobId/signatures')
export class SignaturesController {
  constructor(private readonly signatures: SignaturesService) {}

  @Get()
  @Roles('admin', 'office', 'lead', 'tech')
  @ApiOperation({ summary: 'The signatures captured for the job’s next revision (lead, homeowner)' })
  @ApiContract({ responses: { 200: z.array(JobSignatureResponseSchema) } })
  list(@CurrentUser() user: AuthUser, @Param('jobId', uuid) jobId: string): Promise<JobSignatureResponse[]> {
    return this.signatures.list(user, jobId);
  }

  @Put(':role')
  @ApiJobVersion()
  @ApiOperation({ summary: 'Save (or replace) the crew lead’s or homeowner’s signature: SVG path data in a 0 0 400 120 box' })
  @ApiContract({ body: SignatureInputSchema, responses: { 200: SignatureWriteResponseSchema } })
  save(
    @CurrentUser() user: AuthUser,
    @Param('jobId', uuid) jobId: string,
    @Param('role', new ParseSignatureRolePipe()) role: SignatureRole,
    @ExpectedVersion() version: number,
    @Body(new ZodValidationPipe(SignatureInputSchema)) body: SignatureInput,
  ): Promise<SignatureWriteResponse> {
    return this.signatures.save(user, jobId, role, version, body);
  }

  @Delete(':role')
  @ApiJobVersion()
  @ApiOperation({ summary: 'Clear a signature before issuing' })
  @ApiContract({ responses: { 200: JobVersionResponseSchema } })
  remove(
    @CurrentUser() user: AuthUser,
    @Param('jobId', uuid) jobId: string,
    @Param('role', new ParseSignatureRolePipe()) role: SignatureRole,
    @ExpectedVersion() version: number,
  ): Promise<JobVersionResponse> {
    return this.signatures.remove(user, jobId, role, version);
  }
}
