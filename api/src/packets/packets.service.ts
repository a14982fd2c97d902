import { createHash } from 'node:crypto';

import { Inject, Injectable, InternalServerErrorException, Logger } from '@nestjs/common';

import { AuditService } from '../audit/audit.service.js';
import type { AuthUser } from '../common/decorators/current-user.decorator.js';
import { isUniqueViolation } from '../common/db-errors.js';
import type { Site } from '../db/schema/index.js';
import { ConflictError, findOrFail, ValidationError } from '../domain/errors.js';
import { analyzeAsBuilt } from '../domain/analysis/analyze.js';
import { canIssuePacket } from '../domain/jobs/job-rules.js';
import { packetFileBase } from '../domain/packet/manifest.js';
import { findingKey, type IssuePacketInput, matchAcknowledgements } from '../domain/packet/known-exceptions.js';
import type { PacketSnapshot } from '../domain/packet/packet-snapshot.js';
import { baselineChannelSetups, baselineSystem, whatChanged } from '../domain/packet/what-changed.js';
import { jobWorkDate, toAsBuilt, toChannelSetups, toSiteRecords } from '../jobs/as-built-rows.js';
import { denied, jobNotFound, versionConflict } from '../jobs/job-errors.js';
import { JobsRepository } from '../jobs/jobs.repository.js';
import { LocateLinksService } from '../locate/locate-links.service.js';
import { planCalibrationOf } from '../sites/plan-image-ref.js';
import { OBJECT_STORAGE, type ObjectStorage } from '../storage/object-storage.js';
import type { IssuePacketResponse, IssueWarning, PacketRevisionResponse } from '../domain/packet/packet-revision.schema.js';
import { packetNotFound } from './packet-errors.js';
import { PacketQueue } from './packet-queue.js';
import { type PacketRevisionSummary, PacketsRepository } from './packets.repository.js';
import { SignaturesRepository } from './signatures.repository.js';

export type { IssuePacketResponse, IssueWarning, PacketRevisionResponse } from '../domain/packet/packet-revision.schema.js';

/** Warnings for a packet issued with these settings (the profile is copied into the revision as it is). */
export function issueWarnings(settings: { contactPhone: string | null }): IssueWarning[] {
  return settings.contactPhone?.trim()
    ? []
    : [
        {
          code: 'PACKET_WITHOUT_PHONE',
          message:
            'The company profile has no phone number, so this packet carries no contact number for the homeowner or whoever digs there. Add one in Settings → Company profile and issue a new revision to print it.',
        },
      ];
}

function toResponse(row: PacketRevisionSummary): PacketRevisionResponse {
  const isReady = row.status === 'ready';
  return {
    id: row.id,
    jobId: row.jobId,
    revision: row.revision,
    status: row.status,
    failureReason: row.failureReason,
    attempts: row.attempts,
    paperSize: row.paperSize,
    pageCount: row.pageCount,
    pdf: isReady && row.pdfSha256 ? { bytes: row.pdfBytes ?? 0, sha256: row.pdfSha256, url: `/api/packets/${row.id}/pdf` } : null,
    archive: isReady && row.zipSha256 ? { bytes: row.zipBytes ?? 0, sha256: row.zipSha256, url: `/api/packets/${row.id}/archive.zip` } : null,
    issuedByUserId: row.issuedByUserId,
    issuedAt: row.issuedAt.toISOString(),
    renderedAt: row.renderedAt?.toISOString() ?? null,
  };
}

/**
 * 400 for an issue whose acknowledgements do not match the open findings: names the first missing
 * must-fix finding (code and path) or the bad entry, and lists every problem in `issues`.
 */
function acknowledgementsRefused(problems: ReturnType<typeof matchAcknowledgements>['problems']): ValidationError {
  const issues = problems.map((p) =>
    p.kind === 'missing'
      ? {
          path: 'acknowledgements',
          message: `must acknowledge the must-fix finding ${findingKey(p.finding)} with a reason`,
          code: p.finding.code,
          findingPath: p.finding.path.join('.'),
        }
      : {
          path: `acknowledgements.${p.index}`,
          message:
            p.kind === 'unknown'
              ? `${p.code} at "${p.path}" is not an open finding of this job`
              : `${p.code} at "${p.path}" is acknowledged twice`,
          code: p.code,
          findingPath: p.path,
        },
  );
  const first = issues[0]!;
  return new ValidationError(issues, {
    message: `${first.path}: ${first.message}`,
    code: problems.some((p) => p.kind === 'missing') ? 'FINDINGS_NOT_ACKNOWLEDGED' : 'VALIDATION_FAILED',
  });
}


export interface PacketFile {
  body: Buffer;
  sha256: string;
  fileName: string;
  contentType: string;
}

/**
 * Issuing handover packets: freezes the job's as-built into a revision snapshot, moves the job to
 * `issued` and queues the render, all or nothing; lists revisions; serves their verified files.
 */
/** The site's plan image for the snapshot, when it has one and it is calibrated (otherwise it cannot be placed). */
function snapshotPlanImage(site: Site): Pick<PacketSnapshot['site'], 'planImage'> {
  const calibration = planCalibrationOf(site);
  if (calibration === null || site.planImageScreenRef === null || site.planImageWidthPx === null || site.planImageHeightPx === null) return {};
  return { planImage: { screenKey: site.planImageScreenRef, widthPx: site.planImageWidthPx, heightPx: site.planImageHeightPx, calibration } };
}

@Injectable()
export class PacketsService {
  private readonly logger = new Logger(PacketsService.name);

  constructor(
    private readonly repository: PacketsRepository,
    private readonly jobs: JobsRepository,
    private readonly queue: PacketQueue,
    private readonly audit: AuditService,
    private readonly locateLinks: LocateLinksService,
    private readonly signatures: SignaturesRepository,
    @Inject(OBJECT_STORAGE) private readonly storage: ObjectStorage,
  ) {}

  /**
   * Issues the job's current revision. The job row is locked for the whole transaction, so two issues
   * of the same job run one after the other and the second finds the job already issued (409); the
   * unique (job, revision) constraint backs this up. The render is queued after the commit; a message
   * lost in between is re-sent when a worker starts.
   */
  async issue(actor: AuthUser, jobId: string, expectedVersion: number, input: IssuePacketInput = {}): Promise<IssuePacketResponse> {
    const { revision, jobVersion, warnings } = await this.jobs.transaction(async (tx) => {
      const job = await findOrFail(this.jobs.lock(actor.companyId, jobId, tx), jobNotFound);
      const decision = canIssuePacket({ role: actor.role, userId: actor.id }, job);
      if (!decision.isAllowed) throw denied(decision);
      if (job.version !== expectedVersion) throw versionConflict(job.version);

      const view = await this.jobs.findView(actor.companyId, jobId, tx);
      const place = await this.repository.siteWithCustomer(job.siteId, tx);
      if (!view || !place) throw jobNotFound();
      // Issuing dates this job's records and its changes to earlier ones with its work date, so the
      // frozen system says when each record went in (and since when it is abandoned or removed).
      await this.jobs.markIssued(job.id, jobWorkDate(job), tx);
      const rows = await this.jobs.loadRecord(job, tx);
      const asBuilt = toAsBuilt(rows);
      const settings = await this.repository.settings(actor.companyId, tx);
      // The company's depth rules (its own table, or the shipped defaults); other options keep their defaults.
      const analysis = analyzeAsBuilt(asBuilt, settings.depthRules ? { depthRules: settings.depthRules } : {});
      const { problems, accepted } = matchAcknowledgements(analysis.findings, input.acknowledgements ?? []);
      if (problems.length > 0) throw acknowledgementsRefused(problems);
      const issuedAt = new Date();
      // The site's record: provenance of every record, what this job took out, and what changed
      // against the site's previous packet (which this one supersedes).
      // Whether a record was issued before is about the job being edited, not part of the frozen packet.
      const siteRecords = Object.fromEntries(Object.entries(toSiteRecords(rows)).map(([id, { isIssued: _isIssued, ...info }]) => [id, info]));
      const removedRecords = rows.system?.removedByThisJob ?? [];
      const previous = await this.jobs.latestSitePacket(job.siteId, tx);
      // The system the previous packet left: itself, or (issued before the site record) merged with the
      // other jobs' packets of then.
      const baselinePackets = previous
        ? (await this.jobs.sitePacketsUpTo(job.siteId, previous.issuedAt, tx)).flatMap((p) =>
            p.asBuilt ? [{ issuedAt: p.issuedAt.toISOString(), asBuilt: p.asBuilt, isSiteWide: p.isSiteWide, channelSetups: p.channelSetups }] : [],
          )
        : [];
      const baseline = previous ? baselineSystem(baselinePackets) : undefined;
      // Amplifier settings are not part of the as-built items: compared beside them.
      const channelSetups = toChannelSetups(rows);
      const previousSetups = baselineChannelSetups(baselinePackets);
      const changes =
        previous && baseline
          ? whatChanged({
              supersedes: { revisionId: previous.revisionId, jobId: previous.jobId, jobTitle: previous.jobTitle, revision: previous.revision, issuedAt: previous.issuedAt.toISOString() },
              previous: baseline,
              current: asBuilt,
              records: siteRecords,
              removed: removedRecords,
              job: { id: job.id, title: job.title, workDate: jobWorkDate(job) },
              ...(previousSetups ? { setups: { previous: previousSetups, current: channelSetups } } : {}),
            })
          : undefined;
      const snapshot: PacketSnapshot = {
        format: 1,
        revision: job.revision,
        issuedAt: issuedAt.toISOString(),
        issuedBy: { id: actor.id, name: (await this.repository.userName(actor.id, tx)) ?? '' },
        // The company profile is copied as it is now, logo key included (logos are never overwritten),
        // so re-rendering this revision later prints the same name, contact and logo.
        company: { id: actor.companyId, name: await this.repository.companyName(actor.companyId, tx), logoKey: settings.logoKey },
        settings: {
          paperSize: settings.paperSize,
          units: settings.units,
          licenceNumbers: settings.licenceNumbers,
          contactPhone: settings.contactPhone,
          contactEmail: settings.contactEmail,
          website: settings.website,
          postalAddress: settings.postalAddress,
          timeZone: settings.timeZone,
          locale: settings.locale,
        },
        job: { id: job.id, title: job.title, startDate: job.startDate, endDate: job.endDate, notes: job.notes },
        site: {
          id: place.site.id,
          label: place.site.label,
          addressLine1: place.site.addressLine1,
          addressLine2: place.site.addressLine2,
          city: place.site.city,
          region: place.site.region,
          postalCode: place.site.postalCode,
          country: place.site.country,
          ...snapshotPlanImage(place.site),
        },
        customer: place.customer,
        crewLead: job.crewLeadUserId && view.crewLeadName !== null ? { id: job.crewLeadUserId, name: view.crewLeadName } : null,
        technicians: await this.jobs.technicians(jobId, tx),
        asBuilt,
        analysis,
        channelSetups,
        ...(accepted.length > 0 ? { acknowledgements: accepted } : {}),
        siteRecords,
        removedRecords,
        ...(changes ? { whatChanged: changes } : {}),
      };
      let inserted: PacketRevisionSummary;
      try {
        inserted = await this.repository.insert(
          {
            companyId: actor.companyId,
            jobId,
            revision: job.revision,
            snapshot,
            paperSize: settings.paperSize,
            issuedByUserId: actor.id,
            issuedAt,
          },
          tx,
        );
      } catch (error) {
        if (isUniqueViolation(error)) {
          throw new ConflictError('PACKET_ALREADY_ISSUED', `Revision ${job.revision} of this job is already issued.`);
        }
        throw error;
      }
      // The walkthrough signatures captured on the job belong to this revision from now on.
      const signatureCount = await this.signatures.moveToRevision(jobId, inserted.id, tx);
      // The QR code on the cover: the site's long-lived locate link (made now if none is active).
      await this.locateLinks.urlForIssuedRevision(actor, job.siteId, inserted.id, tx);
      await this.jobs.update(jobId, { status: 'issued' }, tx);
      const version = await this.jobs.bumpVersion(jobId, tx);
      await this.audit.record(
        {
          companyId: actor.companyId,
          actorUserId: actor.id,
          action: 'packet.issue',
          targetType: 'packet_revision',
          targetId: inserted.id,
          details: {
            jobId,
            revision: job.revision,
            jobVersion: version,
            signatureCount,
            acknowledgedFindings: accepted.map((a) => ({ code: a.code, path: a.path, reason: a.reason })),
          },
        },
        tx,
      );
      return { revision: inserted, jobVersion: version, warnings: issueWarnings(settings) };
    });
    await this.queue.enqueue({ revisionId: revision.id }).catch((error: unknown) => {
      // The revision is committed and stays queued; a starting worker re-sends it.
      this.logger.error(`packet ${revision.id} issued but not queued: ${error instanceof Error ? error.message : String(error)}`);
    });
    return { ...toResponse(revision), jobVersion, warnings };
  }

  async listForJob(actor: AuthUser, jobId: string): Promise<PacketRevisionResponse[]> {
    if (!(await this.jobs.findView(actor.companyId, jobId))) throw jobNotFound();
    return (await this.repository.listByJob(actor.companyId, jobId)).map(toResponse);
  }

  async get(actor: AuthUser, id: string): Promise<PacketRevisionResponse> {
    const row = await findOrFail(this.repository.findSummary(actor.companyId, id), packetNotFound);
    return toResponse(row);
  }

  /** The stored PDF or archive, after checking its bytes still hash to the SHA-256 recorded at render. */
  async file(actor: AuthUser, id: string, kind: 'pdf' | 'zip'): Promise<PacketFile> {
    return this.fileInCompany(actor.companyId, id, kind);
  }

  /** As `file`, for callers that checked access themselves (the homeowner portal, the send worker). */
  async fileInCompany(companyId: string, id: string, kind: 'pdf' | 'zip'): Promise<PacketFile> {
    const row = await findOrFail(this.repository.findFiles(companyId, id), packetNotFound);
    const key = kind === 'pdf' ? row.pdfKey : row.zipKey;
    const expected = kind === 'pdf' ? row.pdfSha256 : row.zipSha256;
    if (row.status !== 'ready' || !key || !expected) {
      throw new ConflictError('PACKET_NOT_READY', `This packet revision is ${row.status}, not ready to download.`);
    }
    const body = await this.storage.getBuffer(key);
    const actual = createHash('sha256').update(body).digest('hex');
    if (actual !== expected) {
      this.logger.error(`packet ${id} ${kind} does not match its recorded SHA-256`);
      throw new InternalServerErrorException({ message: 'The stored file failed its integrity check.', code: 'PACKET_FILE_CORRUPT' });
    }
    const base = packetFileBase(row.siteLabel ?? '', row.jobTitle ?? '', row.revision);
    return {
      body,
      sha256: actual,
      fileName: kind === 'pdf' ? `${base}.pdf` : `${base}.zip`,
      contentType: kind === 'pdf' ? 'application/pdf' : 'application/zip',
    };
  }
}
