import { Injectable } from '@nestjs/common';

import { AuditService } from '../audit/audit.service.js';
import type { AuthUser } from '../common/decorators/current-user.decorator.js';
import type { Tx } from '../db/db.module.js';
import type { Job } from '../db/schema/index.js';
import { findOrFail } from '../domain/errors.js';
import type { AsBuilt } from '../domain/as-built/as-built.schema.js';
import { canWriteJob, type JobAccessFacts, type JobWriteKind } from '../domain/jobs/job-rules.js';
import type { JobVersionResponse } from '../domain/jobs/job.schema.js';
import { type JobRecordRows, toAsBuilt } from './as-built-rows.js';
import { denied, jobNotFound, versionConflict } from './job-errors.js';
import { JobsRepository } from './jobs.repository.js';

export interface WriteContext {
  tx: Tx;
  job: Job;
  /** The job's current rows and as-built, loaded on first use within the write's transaction. */
  record: () => Promise<{ rows: JobRecordRows; asBuilt: AsBuilt }>;
}

export interface AuditTarget {
  action: string;
  targetType: string;
  targetId: string;
  details?: Record<string, unknown>;
}

/**
 * Runs one write to a job or its children in a transaction: locks the job row, checks the company
 * (404), the user's rights for this kind of write (403/409), and the version the client last saw (412
 * `VERSION_CONFLICT` with `currentVersion`); then does the work, bumps `jobs.version` and writes the
 * audit entry. Anything thrown rolls the whole transaction back, so a refused write writes nothing.
 */
@Injectable()
export class JobWriter {
  constructor(
    private readonly repository: JobsRepository,
    private readonly audit: AuditService,
  ) {}

  async facts(job: Job, tx: Tx): Promise<JobAccessFacts> {
    const crew = await this.repository.technicians(job.id, tx);
    return { status: job.status, crewLeadUserId: job.crewLeadUserId, crewUserIds: crew.map((c) => c.id) };
  }

  /** Locks the job (404 when not in the actor's company) and checks the expected version. */
  async lockChecked(actor: AuthUser, jobId: string, expectedVersion: number, kind: JobWriteKind, tx: Tx): Promise<Job> {
    const job = await findOrFail(this.repository.lock(actor.companyId, jobId, tx), jobNotFound);
    const decision = canWriteJob({ role: actor.role, userId: actor.id }, await this.facts(job, tx), kind);
    if (!decision.isAllowed) throw denied(decision);
    if (job.version !== expectedVersion) throw versionConflict(job.version);
    return job;
  }

  async write<T extends object>(
    actor: AuthUser,
    jobId: string,
    expectedVersion: number,
    kind: JobWriteKind,
    work: (ctx: WriteContext) => Promise<{ result: T; audit: AuditTarget }>,
  ): Promise<T & JobVersionResponse> {
    return this.repository.transaction(async (tx) => {
      const job = await this.lockChecked(actor, jobId, expectedVersion, kind, tx);
      let loaded: { rows: JobRecordRows; asBuilt: AsBuilt } | undefined;
      const record = async () => {
        if (!loaded) {
          const rows = await this.repository.loadRecord(job, tx);
          loaded = { rows, asBuilt: toAsBuilt(rows) };
        }
        return loaded;
      };
      const { result, audit } = await work({ tx, job, record });
      const jobVersion = await this.repository.bumpVersion(job.id, tx);
      await this.audit.record(
        {
          companyId: actor.companyId,
          actorUserId: actor.id,
          action: audit.action,
          targetType: audit.targetType,
          targetId: audit.targetId,
          details: { jobId: job.id, jobVersion, ...audit.details },
        },
        tx,
      );
      return { ...result, jobVersion };
    });
  }
}
