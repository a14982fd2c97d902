import { Injectable } from '@nestjs/common';

import { AuditService } from '../audit/audit.service.js';
import type { AuthUser } from '../common/decorators/current-user.decorator.js';
import type { Tx } from '../db/db.module.js';
import { ConflictError, findOrFail } from '../domain/errors.js';
import { analyzeAsBuilt } from '../domain/analysis/analyze.js';
import type { Role } from '../domain/auth/roles.js';
import { canTransition } from '../domain/jobs/job-rules.js';
import type {
  ChangeJobStatusInput,
  CreateJobInput,
  JobAsBuiltResponse,
  JobListQuery,
  JobListResponse,
  JobResponse,
  JobSummaryResponse,
  UpdateJobInput,
} from '../domain/jobs/job.schema.js';
import type { FieldIssue } from '../domain/jobs/record-validation.js';
import { sortedCursorPageOf } from '../domain/paging/page.schema.js';
import { AsBuiltCache, type CachedAsBuilt, sha1, spliceAsBuiltAnswer } from './as-built-cache.js';
import { depthReadingIdsByRun, toAsBuilt, toChannelSetups, toSiteRecords } from './as-built-rows.js';
import { denied, invalid, jobNotFound, versionConflict } from './job-errors.js';
import { JobWriter } from './job-writer.js';
import { type JobView, JobsRepository } from './jobs.repository.js';

function toJobSummary(view: JobView): JobSummaryResponse {
  const { job } = view;
  return {
    id: job.id,
    title: job.title,
    status: job.status,
    revision: job.revision,
    version: job.version,
    site: view.site,
    customer: view.customer,
    crewLead: job.crewLeadUserId && view.crewLeadName !== null ? { id: job.crewLeadUserId, name: view.crewLeadName } : null,
    startDate: job.startDate,
    endDate: job.endDate,
    updatedAt: job.updatedAt.toISOString(),
  };
}

function toJobResponse(view: JobView, technicians: { id: string; name: string }[]): JobResponse {
  return {
    ...toJobSummary(view),
    technicians,
    notes: view.job.notes,
    reviewComment: view.job.reviewComment,
    createdAt: view.job.createdAt.toISOString(),
  };
}

/** Who may be put on a crew: the crew lead leads (office/admin may lead too), the crew are techs and leads. */
const CREW_LEAD_ROLES: readonly Role[] = ['lead', 'office', 'admin'];
const TECHNICIAN_ROLES: readonly Role[] = ['tech', 'lead'];

@Injectable()
export class JobsService {
  constructor(
    private readonly repository: JobsRepository,
    private readonly writer: JobWriter,
    private readonly audit: AuditService,
    private readonly cache: AsBuiltCache,
  ) {}

  async list(actor: AuthUser, query: JobListQuery): Promise<JobListResponse> {
    const { rows, total } = await this.repository.list(actor.companyId, actor.id, query);
    return sortedCursorPageOf(rows, total, query, (row) => row.sortKey, toJobSummary);
  }

  async get(actor: AuthUser, id: string): Promise<JobResponse> {
    const view = await findOrFail(this.repository.findView(actor.companyId, id), jobNotFound);
    return toJobResponse(view, await this.repository.technicians(id));
  }

  private async view(actor: AuthUser, id: string, tx: Tx): Promise<JobResponse> {
    const view = await findOrFail(this.repository.findView(actor.companyId, id, tx), jobNotFound);
    return toJobResponse(view, await this.repository.technicians(id, tx));
  }

  /** 400 naming the field when a crew member is not an active user of the company in a suitable role. */
  private async checkCrew(
    actor: AuthUser,
    input: { crewLeadUserId?: string | null; technicianUserIds?: string[] },
    tx: Tx,
  ): Promise<void> {
    const ids = [...(input.crewLeadUserId ? [input.crewLeadUserId] : []), ...(input.technicianUserIds ?? [])];
    const found = new Map((await this.repository.findUsers(actor.companyId, ids, tx)).map((u) => [u.id, u]));
    const issues: FieldIssue[] = [];
    if (input.crewLeadUserId) {
      const user = found.get(input.crewLeadUserId);
      if (!user || user.isDisabled || !CREW_LEAD_ROLES.includes(user.role)) {
        issues.push({ path: 'crewLeadUserId', message: 'is not an active crew lead of your company' });
      }
    }
    input.technicianUserIds?.forEach((id, i) => {
      const user = found.get(id);
      if (!user || user.isDisabled || !TECHNICIAN_ROLES.includes(user.role)) {
        issues.push({ path: `technicianUserIds.${i}`, message: 'is not an active technician or crew lead of your company' });
      }
    });
    if (issues.length > 0) throw invalid(issues);
  }

  async create(actor: AuthUser, input: CreateJobInput): Promise<JobResponse> {
    return this.repository.transaction(async (tx) => {
      if (!(await this.repository.siteInCompany(actor.companyId, input.siteId, tx))) {
        throw invalid([{ path: 'siteId', message: 'no such site in your company' }]);
      }
      await this.checkCrew(actor, input, tx);
      const job = await this.repository.insert(
        {
          companyId: actor.companyId,
          siteId: input.siteId,
          title: input.title,
          crewLeadUserId: input.crewLeadUserId ?? null,
          startDate: input.startDate ?? null,
          endDate: input.endDate ?? null,
          notes: input.notes ?? null,
          createdByUserId: actor.id,
        },
        tx,
      );
      await this.repository.replaceTechnicians(job.id, input.technicianUserIds ?? [], tx);
      await this.audit.record(
        {
          companyId: actor.companyId,
          actorUserId: actor.id,
          action: 'job.create',
          targetType: 'job',
          targetId: job.id,
          details: { siteId: input.siteId, title: input.title },
        },
        tx,
      );
      return this.view(actor, job.id, tx);
    });
  }

  /** A crew lead may change only the notes (part of the record); everything else is the office's. */
  async update(actor: AuthUser, id: string, expectedVersion: number, input: UpdateJobInput): Promise<JobResponse> {
    const isNotesOnly = Object.keys(input).every((key) => key === 'notes');
    await this.writer.write(actor, id, expectedVersion, isNotesOnly ? 'record' : 'details', async ({ tx, job }) => {
      await this.checkCrew(actor, input, tx);
      const startDate = input.startDate === undefined ? job.startDate : input.startDate;
      const endDate = input.endDate === undefined ? job.endDate : input.endDate;
      if (startDate && endDate && startDate > endDate) {
        throw invalid([{ path: 'endDate', message: 'must not be before the start date' }]);
      }
      const { technicianUserIds, ...fields } = input;
      await this.repository.update(id, fields, tx);
      if (technicianUserIds) await this.repository.replaceTechnicians(id, technicianUserIds, tx);
      return { result: {}, audit: { action: 'job.update', targetType: 'job', targetId: id, details: { fields: Object.keys(input) } } };
    });
    return this.get(actor, id);
  }

  async remove(actor: AuthUser, id: string, expectedVersion: number): Promise<void> {
    await this.repository.transaction(async (tx) => {
      const job = await this.writer.lockChecked(actor, id, expectedVersion, 'delete', tx);
      if ((await this.repository.changedEarlierRecords(id, tx)) > 0) {
        throw new ConflictError('JOB_CHANGED_SITE_RECORDS', 'This job changed records earlier jobs installed on this property. Undo those changes first, then delete the job.');
      }
      await this.repository.delete(id, tx);
      await this.audit.record(
        { companyId: actor.companyId, actorUserId: actor.id, action: 'job.delete', targetType: 'job', targetId: id, details: { title: job.title } },
        tx,
      );
    });
  }

  /**
   * Moves the job through its status machine (see job-rules). Reopening an issued job starts the next
   * revision; a comment (required when sending a job back) is kept as the job's review comment.
   */
  async changeStatus(actor: AuthUser, id: string, expectedVersion: number, input: ChangeJobStatusInput): Promise<JobResponse> {
    return this.repository.transaction(async (tx) => {
      const job = await findOrFail(this.repository.lock(actor.companyId, id, tx), jobNotFound);
      const decision = canTransition({ role: actor.role, userId: actor.id }, await this.writer.facts(job, tx), input.to, input.comment);
      if (!decision.isAllowed) {
        if (decision.code === 'COMMENT_REQUIRED') throw invalid([{ path: 'comment', message: decision.message }]);
        throw denied(decision);
      }
      if (job.version !== expectedVersion) throw versionConflict(job.version);
      const revision = decision.isNewRevision ? job.revision + 1 : job.revision;
      await this.repository.update(
        id,
        { status: input.to, revision, ...(input.comment ? { reviewComment: input.comment } : {}) },
        tx,
      );
      const jobVersion = await this.repository.bumpVersion(id, tx);
      await this.audit.record(
        {
          companyId: actor.companyId,
          actorUserId: actor.id,
          action: 'job.status',
          targetType: 'job',
          targetId: id,
          details: { from: job.status, to: input.to, revision, jobVersion, ...(input.comment ? { comment: input.comment } : {}) },
        },
        tx,
      );
      return this.view(actor, id, tx);
    });
  }

  /**
   * The job, its whole as-built (ids are the rows' uuids) and the analysis. The job part is read fresh
   * on every call (names of its crew, site and customer change without a job version); the rest comes
   * from the AsBuiltCache under the job version, site version and depth rule table read in the same
   * single query, or is computed from one consistent snapshot (a fixed number of queries however large
   * the job is) and kept there.
   */
  /** The caller's company locale: the drawings' legend is spelled for it (en-US "color", en-GB "colour"). */
  companyLocale(actor: AuthUser): Promise<string> {
    return this.repository.companyLocale(actor.companyId);
  }

  async asBuilt(actor: AuthUser, id: string): Promise<JobAsBuiltResponse> {
    const { job, cached } = await this.asBuiltParts(actor, id);
    return { job, ...cached.part };
  }

  /**
   * The as-built answer as UTF-8 JSON with its ETag (a hash of the job part and of the cached part), so
   * a cache hit is neither analysed, serialised nor encoded again (only the small job part is).
   */
  async asBuiltAnswer(actor: AuthUser, id: string): Promise<{ body: Buffer; etag: string }> {
    const { job, cached } = await this.asBuiltParts(actor, id);
    const jobJson = JSON.stringify(job);
    return { body: spliceAsBuiltAnswer(jobJson, cached), etag: `"${sha1(`${sha1(jobJson)}.${cached.partHash}`)}"` };
  }

  private async asBuiltParts(actor: AuthUser, id: string): Promise<{ job: JobResponse; cached: CachedAsBuilt }> {
    const head = await findOrFail(this.repository.findAsBuiltHead(actor.companyId, id), jobNotFound);
    const hit = this.cache.get(AsBuiltCache.key(id, head.view.job.version, `${head.siteVersion}/${head.systemState}`, head.depthRules));
    if (hit) return { job: toJobResponse(head.view, head.technicians), cached: hit };
    const { fresh, rows } = await this.repository.snapshot(async (tx) => {
      const fresh = await findOrFail(this.repository.findAsBuiltHead(actor.companyId, id, tx), jobNotFound);
      return { fresh, rows: await this.repository.loadRecord(fresh.view.job, tx) };
    });
    const asBuilt = toAsBuilt(rows);
    const cached = this.cache.set(AsBuiltCache.key(id, fresh.view.job.version, `${fresh.siteVersion}/${fresh.systemState}`, fresh.depthRules), {
      asBuilt,
      // The company's depth rules (Settings → Depth rules); the other analysis options keep their documented defaults.
      analysis: analyzeAsBuilt(asBuilt, fresh.depthRules ? { depthRules: fresh.depthRules } : {}),
      records: {
        depthReadingIds: depthReadingIdsByRun(rows),
        channelSetups: toChannelSetups(rows),
        siteRecords: toSiteRecords(rows),
        removedByThisJob: rows.system?.removedByThisJob ?? [],
      },
    });
    return { job: toJobResponse(fresh.view, fresh.technicians), cached };
  }
}

