import { z } from 'zod';

import type { AsBuiltAnalysis } from '../analysis/analyze.js';
import type { AsBuilt } from '../as-built/as-built.schema.js';
import { IsoDateSchema } from '../as-built/common.schema.js';
import { JOB_STATUSES, type JobStatus, REQUESTABLE_STATUSES } from './job-rules.js';
import type { ChannelSetup } from './job-record.schema.js';

export const JobStatusSchema = z.enum(JOB_STATUSES);

const TitleSchema = z.string().trim().min(1, { error: 'is required' }).max(160);
const NotesSchema = z.string().max(4000).nullable();
const CrewSchema = z
  .array(z.uuid())
  .max(50)
  .refine((ids) => new Set(ids).size === ids.length, { error: 'lists someone twice' });

export const CreateJobSchema = z
  .object({
    siteId: z.uuid(),
    title: TitleSchema,
    crewLeadUserId: z.uuid().nullable().optional(),
    technicianUserIds: CrewSchema.optional(),
    startDate: IsoDateSchema.nullable().optional(),
    endDate: IsoDateSchema.nullable().optional(),
    notes: NotesSchema.optional(),
  })
  .refine((j) => !j.startDate || !j.endDate || j.startDate <= j.endDate, {
    error: 'must not be before the start date',
    path: ['endDate'],
  });
export type CreateJobInput = z.infer<typeof CreateJobSchema>;

/** Fields of a job a write may change. The site is fixed: its reference points anchor the ties. */
export const JobDetailsSchema = z.object({
  title: TitleSchema,
  crewLeadUserId: z.uuid().nullable(),
  technicianUserIds: CrewSchema,
  startDate: IsoDateSchema.nullable(),
  endDate: IsoDateSchema.nullable(),
  notes: NotesSchema,
});
export type JobDetails = z.infer<typeof JobDetailsSchema>;

/** `PATCH /api/jobs/:id`: any of the job's details; the dates are checked against the stored ones too. */
export const UpdateJobSchema = JobDetailsSchema.partial().refine((v) => Object.keys(v).length > 0, { error: 'nothing to change' });
export type UpdateJobInput = z.infer<typeof UpdateJobSchema>;

/**
 * `POST /api/jobs/:id/status`. The job version may be given here (`expectedVersion`) or in `If-Match`.
 */
export const ChangeJobStatusSchema = z.object({
  to: z.enum(REQUESTABLE_STATUSES),
  comment: z.string().trim().max(2000).optional(),
  expectedVersion: z.number().int().min(1).optional(),
});
export type ChangeJobStatusInput = z.infer<typeof ChangeJobStatusSchema>;

export const JOB_SORTS = ['updatedAt', 'title', 'status', 'startDate', 'site', 'customer'] as const;
export type JobSortField = (typeof JOB_SORTS)[number];

/**
 * `GET /api/jobs`: `q` searches title, site label/address/city and customer name; `status` takes one
 * status, a comma-separated list or the parameter repeated (`status=draft&status=in_progress`); `sort` is a field, `-field` for descending (default `-updatedAt`);
 * `page` is 1-based; `mine=true` keeps jobs the caller leads or is assigned to.
 */
export const JobListQuerySchema = z.object({
  q: z.string().trim().max(120).optional(),
  status: z
    .union([z.string(), z.array(z.string()).max(JOB_STATUSES.length * 2)])
    .transform((value, ctx) => {
      const parts = (Array.isArray(value) ? value : [value]).flatMap((s) => s.split(',')).map((part) => part.trim()).filter(Boolean);
      const unknown = parts.filter((part) => !(JOB_STATUSES as readonly string[]).includes(part));
      if (unknown.length > 0) {
        ctx.addIssue({ code: 'custom', message: `unknown status ${unknown.join(', ')}: use ${JOB_STATUSES.join(', ')}` });
        return z.NEVER;
      }
      return [...new Set(parts)] as JobStatus[];
    })
    .optional(),
  sort: z
    .string()
    .regex(new RegExp(`^-?(${JOB_SORTS.join('|')})$`), { error: `must be one of ${JOB_SORTS.join(', ')} (prefix - for descending)` })
    .default('-updatedAt'),
  page: z.coerce.number().int().min(1).max(100_000).default(1),
  pageSize: z.coerce.number().int().min(1).max(100).default(25),
  mine: z
    .enum(['true', 'false'])
    .transform((v) => v === 'true')
    .optional(),
});
export type JobListQuery = z.infer<typeof JobListQuerySchema>;

export interface PersonRef {
  id: string;
  name: string;
}

export interface JobSummaryResponse {
  id: string;
  title: string;
  status: JobStatus;
  revision: number;
  version: number;
  site: { id: string; label: string; city: string };
  customer: { id: string; name: string };
  crewLead: PersonRef | null;
  startDate: string | null;
  endDate: string | null;
  updatedAt: string;
}

export interface JobListResponse {
  items: JobSummaryResponse[];
  total: number;
  page: number;
  pageSize: number;
}

export interface JobResponse extends JobSummaryResponse {
  technicians: PersonRef[];
  notes: string | null;
  reviewComment: string | null;
  createdAt: string;
}

/** `GET /api/jobs/:id/as-built`: the job, its as-built (ids are database uuids) and the analysis. */
export interface JobAsBuiltResponse {
  job: JobResponse;
  asBuilt: AsBuilt;
  analysis: AsBuiltAnalysis;
  /**
   * What the as-built contract has no place for: the ids of depth readings (parallel to each run's
   * `depthReadings`) so they can be edited, and each amplifier channel's setup, by channel id.
   */
  records: {
    depthReadingIds: Record<string, string[]>;
    channelSetups: Record<string, ChannelSetup>;
    /**
     * The as-built is the site's installed system as it will stand after this job: records installed by
     * earlier issued jobs and this job's own. Per record id: who installed it and when, its changes, and
     * whether it was abandoned (`isThisJob` false = existing, read-only until this job changes it).
     */
    siteRecords?: Record<string, SiteRecordInfo>;
    /** Earlier records this job removes (taken out of the ground; no longer in the as-built). */
    removedByThisJob?: { kind: 'item' | 'run'; id: string; label: string; removedOn: string }[];
  };
}

/** Provenance of one record of a site's installed system (see JobAsBuiltResponse.records.siteRecords). */
export interface SiteRecordInfo {
  kind: 'item' | 'run';
  /** Installed by the job being viewed (false: an earlier job's record, already in the ground). */
  isThisJob: boolean;
  installedBy: { jobId: string; jobTitle: string };
  /** ISO date: the installing job's work date. */
  installedOn: string;
  /** Jobs that changed the record after it went in, oldest first (`isIssued` false: not issued yet). */
  changedBy: { jobId: string; jobTitle: string; change: 'changed' | 'abandoned' | 'removed'; on: string; isIssued: boolean }[];
  /** Abandoned in place: by which job, since when. */
  abandoned: { jobId: string; jobTitle: string; on: string } | null;
}

/** Every write to a job's children answers with the job's new version. */
export interface JobVersionResponse {
  jobVersion: number;
}
