import { Injectable } from '@nestjs/common';

import type { AuthUser } from '../common/decorators/current-user.decorator.js';
import type { JobSignatureRow } from '../db/schema/index.js';
import { NotFoundError } from '../domain/errors.js';
import type { JobVersionResponse } from '../domain/jobs/job.schema.js';
import type { JobSignatureResponse, SignatureInput, SignatureRole } from '../domain/packet/signature.schema.js';
import { jobNotFound } from '../jobs/job-errors.js';
import { JobWriter } from '../jobs/job-writer.js';
import { JobsRepository } from '../jobs/jobs.repository.js';
import { SignaturesRepository } from './signatures.repository.js';

function toResponse(row: JobSignatureRow): JobSignatureResponse {
  return {
    role: row.role,
    signerName: row.signerName,
    signedAt: row.signedAt.toISOString(),
    svgPath: row.svgPath,
    capturedByUserId: row.capturedByUserId,
  };
}

/**
 * The sign-off at the walkthrough: the crew lead's and the homeowner's signatures on the job's next
 * revision. Writes go through JobWriter (job lock, rights, If-Match version, audit), as every job write.
 */
@Injectable()
export class SignaturesService {
  constructor(
    private readonly repository: SignaturesRepository,
    private readonly jobs: JobsRepository,
    private readonly writer: JobWriter,
  ) {}

  async list(actor: AuthUser, jobId: string): Promise<JobSignatureResponse[]> {
    if (!(await this.jobs.findView(actor.companyId, jobId))) throw jobNotFound();
    return (await this.repository.listByJob(jobId)).map(toResponse);
  }

  async save(
    actor: AuthUser,
    jobId: string,
    role: SignatureRole,
    expectedVersion: number,
    input: SignatureInput,
  ): Promise<{ signature: JobSignatureResponse } & JobVersionResponse> {
    return this.writer.write(actor, jobId, expectedVersion, 'signoff', async ({ tx }) => {
      const row = await this.repository.upsert(
        {
          jobId,
          role,
          signerName: input.signerName,
          signedAt: input.signedAt ? new Date(input.signedAt) : new Date(),
          svgPath: input.svgPath.trim(),
          capturedByUserId: actor.id,
        },
        tx,
      );
      return {
        result: { signature: toResponse(row) },
        audit: { action: 'job.signature.save', targetType: 'job_signature', targetId: row.id, details: { role, signerName: row.signerName } },
      };
    });
  }

  async remove(actor: AuthUser, jobId: string, role: SignatureRole, expectedVersion: number): Promise<JobVersionResponse> {
    return this.writer.write(actor, jobId, expectedVersion, 'signoff', async ({ tx }) => {
      if (!(await this.repository.remove(jobId, role, tx))) {
        throw new NotFoundError('SIGNATURE_NOT_FOUND', `This job has no ${role === 'lead' ? 'crew lead' : 'homeowner'} signature.`);
      }
      return { result: {}, audit: { action: 'job.signature.delete', targetType: 'job', targetId: jobId, details: { role } } };
    });
  }
}
