import { z } from 'zod';

import type { AsBuiltAnalysis } from '../analysis/analyze.js';
import { type AsBuilt, AsBuiltSchema } from '../as-built/as-built.schema.js';
import { AsBuiltAnalysisSchema } from '../analysis/analysis.schema.js';
import { cursorPageSchemaOf, refineCursorPage, refineSortedCursor, sortedCursorPageShape } from '../paging/page.schema.js';
import { IsoDateSchema } from '../as-built/common.schema.js';
import { JOB_STATUSES, type JobStatus, REQUESTABLE_STATUSES } from './job-rules.js';
import { ChannelSetupSchema } from './job-record.schema.js';

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
/** The sorts whose column may be empty (a job without a start date): their cursors may hold no key. */
export const NULLABLE_JOB_SORTS: readonly JobSortField[] = ['startDate'];

/**
 * `GET /api/jobs`: `q` searches title, site label/address/city and customer name; `status` takes one
 * status, a comma-separated list or the parameter repeated (`status=draft&status=in_progress`); `sort` is a field, `-field` for descending (default `-updatedAt`);
 * `page` is 1-based, or `cursor` (the `nextCursor` of the page before, read in the same sort) instead;
 * `mine=true` keeps jobs the caller leads or is assigned to.
 */
const JobListQueryObjectSchema = z.object({
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
  ...sortedCursorPageShape,
  mine: z
    .enum(['true', 'false'])
    .transform((v) => v === 'true')
    .optional(),
});
export const JobListQuerySchema = refineSortedCursor(refineCursorPage(JobListQueryObjectSchema), NULLABLE_JOB_SORTS);
export type JobListQuery = z.infer<typeof JobListQuerySchema>;

export const PersonRefSchema = z.object({ id: z.string(), name: z.string() });
export type PersonRef = z.infer<typeof PersonRefSchema>;

export const JobSummaryResponseSchema = z.object({
  id: z.string(),
  title: z.string(),
  status: z.enum(JOB_STATUSES),
  revision: z.number().int(),
  version: z.number().int(),
  site: z.object({ id: z.string(), label: z.string(), city: z.string() }),
  customer: z.object({ id: z.string(), name: z.string() }),
  crewLead: PersonRefSchema.nullable(),
  startDate: z.string().nullable(),
  endDate: z.string().nullable(),
  updatedAt: z.string(),
});
export type JobSummaryResponse = z.infer<typeof JobSummaryResponseSchema>;

export const JobListResponseSchema = cursorPageSchemaOf(JobSummaryResponseSchema);
export type JobListResponse = z.infer<typeof JobListResponseSchema>;

export const JobResponseSchema = JobSummaryResponseSchema.extend({
  technicians: z.array(PersonRefSchema),
  notes: z.string().nullable(),
  reviewComment: z.string().nullable(),
  createdAt: z.string(),
});
export type JobResponse = z.infer<typeof JobResponseSchema>;

/** Provenance of one record of a site's installed system (see JobAsBuiltResponse.records.siteRecords). */
export const SiteRecordInfoSchema = z.object({
  kind: z.enum(['item', 'run']),
  /** Installed by the job being viewed (false: an earlier job's record, already in the ground). */
  isThisJob: z.boolean(),
  /**
   * Part of the site's issued record: an earlier job's, or this job's issued in an earlier revision (a
   * reopened job). Deleting it records its removal by the job (dated) instead of deleting it. Absent in
   * revisions issued before this was recorded.
   */
  isIssued: z.boolean().optional(),
  installedBy: z.object({ jobId: z.string(), jobTitle: z.string() }),
  /** ISO date: the installing job's work date. */
  installedOn: z.string(),
  /**
   * Jobs that changed the record after it went in, oldest first (`isIssued` false: not issued yet): one
   * entry per job and issue, so a reopened job that changes it again is listed again, with its new date.
   */
  changedBy: z.array(
    z.object({
      jobId: z.string(),
      jobTitle: z.string(),
      change: z.enum(['changed', 'abandoned', 'removed']),
      on: z.string(),
      isIssued: z.boolean(),
    }),
  ),
  /** Abandoned in place: by which job, since when. */
  abandoned: z.object({ jobId: z.string(), jobTitle: z.string(), on: z.string() }).nullable(),
});
export type SiteRecordInfo = z.infer<typeof SiteRecordInfoSchema>;

/** `GET /api/jobs/:id/as-built`: the job, its as-built (ids are database uuids) and the analysis. */
export const JobAsBuiltResponseSchema = z.object({
  job: JobResponseSchema,
  asBuilt: AsBuiltSchema,
  analysis: AsBuiltAnalysisSchema,
  /**
   * What the as-built contract has no place for: the ids of depth readings (parallel to each run's
   * `depthReadings`) so they can be edited, and each amplifier channel's setup, by channel id.
   */
  records: z.object({
    depthReadingIds: z.record(z.string(), z.array(z.string())),
    channelSetups: z.record(z.string(), ChannelSetupSchema),
    /**
     * The as-built is the site's installed system as it will stand after this job: records installed by
     * earlier issued jobs and this job's own. Per record id: who installed it and when, its changes, and
     * whether it was abandoned (`isThisJob` false = existing, read-only until this job changes it).
     */
    siteRecords: z.record(z.string(), SiteRecordInfoSchema).optional(),
    /** Earlier records this job removes (taken out of the ground; no longer in the as-built). */
    removedByThisJob: z.array(z.object({ kind: z.enum(['item', 'run']), id: z.string(), label: z.string(), removedOn: z.string() })).optional(),
  }),
});
/** The as-built and analysis keep their computation types (the schemas describe the same JSON). */
export type JobAsBuiltResponse = Omit<z.infer<typeof JobAsBuiltResponseSchema>, 'asBuilt' | 'analysis'> & {
  asBuilt: AsBuilt;
  analysis: AsBuiltAnalysis;
};

/** Every write to a job's children answers with the job's new version. */
export const JobVersionResponseSchema = z.object({ jobVersion: z.number().int() });
export type JobVersionResponse = z.infer<typeof JobVersionResponseSchema>;
