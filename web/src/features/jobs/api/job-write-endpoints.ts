import {
  ChannelSetupWriteResponseSchema,
  CheckWriteResponseSchema,
  type DepthReadingInput,
  DepthReadingWriteResponseSchema,
  ItemWriteResponseSchema,
  RunWriteResponseSchema,
  type UpdateDepthReadingInput,
  type ZoneInput,
  ZoneWriteResponseSchema,
} from '@domain/jobs/job-record.schema';
import { type ChangeJobStatusInput, JobResponseSchema, JobVersionResponseSchema, type UpdateJobInput } from '@domain/jobs/job.schema';
import { type SignatureInput, type SignatureRole, SignatureWriteResponseSchema } from '@domain/packet/signature.schema';
import { type CreateReferencePointInput, ReferencePointResponseSchema, SiteVersionResponseSchema } from '@domain/sites/site.schema';
import type { z } from 'zod';

/*
 * Every change the web makes to a job or its records, by endpoint name with its URL parameters and its
 * body (issues 17 and 20): a write queued with no signal is kept in IndexedDB in this shape, not as a
 * path string, and is sent again through the one function of its endpoint (send-job-write.ts).
 *
 * Item, run and check bodies are the as-built shapes without the ids the server assigns; the API fills
 * placeholders before validating them (ItemInputSchema, RunInputSchema and CheckInputSchema preprocess
 * their input), so here they are plain objects checked by the server and the forms' schemas.
 */

/** An item, run or check as sent: the as-built record without its id (the server assigns one). */
export type RecordBody = Record<string, unknown>;

/** Each endpoint's URL parameters (below `/api/jobs/:jobId`) and body. */
export type JobWriteEndpoints = {
  updateJob: { params: Record<string, never>; body: UpdateJobInput };
  changeStatus: { params: Record<string, never>; body: ChangeJobStatusInput };
  createZone: { params: Record<string, never>; body: ZoneInput };
  updateZone: { params: { zoneId: string }; body: ZoneInput };
  deleteZone: { params: { zoneId: string }; body?: undefined };
  createItem: { params: Record<string, never>; body: RecordBody };
  replaceItem: { params: { itemId: string }; body: RecordBody };
  deleteItem: { params: { itemId: string }; body?: undefined };
  updateChannelSetup: { params: { itemId: string; channelId: string }; body: RecordBody };
  createRun: { params: Record<string, never>; body: RecordBody };
  replaceRun: { params: { runId: string }; body: RecordBody };
  deleteRun: { params: { runId: string }; body?: undefined };
  undoSiteChange: { params: { recordId: string }; body?: undefined };
  addDepthReading: { params: { runId: string }; body: DepthReadingInput };
  updateDepthReading: { params: { runId: string; readingId: string }; body: UpdateDepthReadingInput };
  deleteDepthReading: { params: { runId: string; readingId: string }; body?: undefined };
  createCheck: { params: Record<string, never>; body: RecordBody };
  replaceCheck: { params: { checkId: string }; body: RecordBody };
  deleteCheck: { params: { checkId: string }; body?: undefined };
  saveSignature: { params: { role: SignatureRole }; body: SignatureInput };
  clearSignature: { params: { role: SignatureRole }; body?: undefined };
  /**
   * A reference point added to the job's site from the job (its plan): a site write, sent on the
   * site's version, queued with the job's writes so a tie made offline to the new point goes after it.
   */
  createReferencePoint: { params: { siteId: string }; body: CreateReferencePointInput };
};

export type JobWriteEndpoint = keyof JobWriteEndpoints;

/** One call of one endpoint: `{ endpoint: 'addDepthReading', params: { runId }, body: { stationM, depthM } }`. */
export type JobWriteCall = {
  [E in JobWriteEndpoint]: { endpoint: E; params: JobWriteEndpoints[E]['params']; body?: JobWriteEndpoints[E]['body'] };
}[JobWriteEndpoint];

export type JobWriteCallOf<E extends JobWriteEndpoint> = Extract<JobWriteCall, { endpoint: E }>;

/**
 * Endpoints that add a record without replacing anyone's: such a write may be sent again on top of
 * whatever version the job has reached (the server still checks the record itself).
 */
const ADDITIVE: ReadonlySet<JobWriteEndpoint> = new Set<JobWriteEndpoint>([
  'createZone',
  'createItem',
  'createRun',
  'addDepthReading',
  'createCheck',
  'createReferencePoint',
]);

export function isAdditiveEndpoint(endpoint: JobWriteEndpoint): boolean {
  return ADDITIVE.has(endpoint);
}

/**
 * HTTP method and path below `/api/jobs/:jobId` of one call; with `siteId`, a write to the job's site
 * instead: the path is below `/api/sites/:siteId` and `If-Match` names the site's version.
 */
export type JobWriteRoute = { method: 'POST' | 'PUT' | 'PATCH' | 'DELETE'; path: string; siteId?: string };

const id = (value: string) => encodeURIComponent(value);

/** The route of each endpoint, typed by its parameters: the only place these paths are written. */
export const JOB_WRITE_ROUTES: { [E in JobWriteEndpoint]: (params: JobWriteEndpoints[E]['params']) => JobWriteRoute } = {
  updateJob: () => ({ method: 'PATCH', path: '' }),
  changeStatus: () => ({ method: 'POST', path: '/status' }),
  createZone: () => ({ method: 'POST', path: '/zones' }),
  updateZone: ({ zoneId }) => ({ method: 'PATCH', path: `/zones/${id(zoneId)}` }),
  deleteZone: ({ zoneId }) => ({ method: 'DELETE', path: `/zones/${id(zoneId)}` }),
  createItem: () => ({ method: 'POST', path: '/items' }),
  replaceItem: ({ itemId }) => ({ method: 'PUT', path: `/items/${id(itemId)}` }),
  deleteItem: ({ itemId }) => ({ method: 'DELETE', path: `/items/${id(itemId)}` }),
  updateChannelSetup: ({ itemId, channelId }) => ({ method: 'PUT', path: `/items/${id(itemId)}/channels/${id(channelId)}/setup` }),
  createRun: () => ({ method: 'POST', path: '/runs' }),
  replaceRun: ({ runId }) => ({ method: 'PUT', path: `/runs/${id(runId)}` }),
  deleteRun: ({ runId }) => ({ method: 'DELETE', path: `/runs/${id(runId)}` }),
  undoSiteChange: ({ recordId }) => ({ method: 'DELETE', path: `/site-changes/${id(recordId)}` }),
  addDepthReading: ({ runId }) => ({ method: 'POST', path: `/runs/${id(runId)}/depth-readings` }),
  updateDepthReading: ({ runId, readingId }) => ({ method: 'PATCH', path: `/runs/${id(runId)}/depth-readings/${id(readingId)}` }),
  deleteDepthReading: ({ runId, readingId }) => ({ method: 'DELETE', path: `/runs/${id(runId)}/depth-readings/${id(readingId)}` }),
  createCheck: () => ({ method: 'POST', path: '/checks' }),
  replaceCheck: ({ checkId }) => ({ method: 'PUT', path: `/checks/${id(checkId)}` }),
  deleteCheck: ({ checkId }) => ({ method: 'DELETE', path: `/checks/${id(checkId)}` }),
  saveSignature: ({ role }) => ({ method: 'PUT', path: `/signatures/${id(role)}` }),
  clearSignature: ({ role }) => ({ method: 'DELETE', path: `/signatures/${id(role)}` }),
  createReferencePoint: ({ siteId }) => ({ method: 'POST', path: '/reference-points', siteId }),
};

/** The answer of a write: records answer `jobVersion`, job-level writes the whole job with `version`. */
export type JobWriteResponse = { jobVersion?: number; version?: number } & Record<string, unknown>;

/** The answer each endpoint declares (its route's `@ApiContract`), which its answers are parsed with. */
export const JOB_WRITE_RESPONSES: { [E in JobWriteEndpoint]: z.ZodType<JobWriteResponse> } = {
  updateJob: JobResponseSchema,
  changeStatus: JobResponseSchema,
  createZone: ZoneWriteResponseSchema,
  updateZone: ZoneWriteResponseSchema,
  deleteZone: JobVersionResponseSchema,
  createItem: ItemWriteResponseSchema,
  replaceItem: ItemWriteResponseSchema,
  deleteItem: JobVersionResponseSchema,
  updateChannelSetup: ChannelSetupWriteResponseSchema,
  createRun: RunWriteResponseSchema,
  replaceRun: RunWriteResponseSchema,
  deleteRun: JobVersionResponseSchema,
  undoSiteChange: JobVersionResponseSchema,
  addDepthReading: DepthReadingWriteResponseSchema,
  updateDepthReading: DepthReadingWriteResponseSchema,
  deleteDepthReading: JobVersionResponseSchema,
  createCheck: CheckWriteResponseSchema,
  replaceCheck: CheckWriteResponseSchema,
  deleteCheck: JobVersionResponseSchema,
  saveSignature: SignatureWriteResponseSchema,
  clearSignature: JobVersionResponseSchema,
  createReferencePoint: ReferencePointResponseSchema.extend(SiteVersionResponseSchema.shape),
};

/** The route of `call`. */
export function routeOf(call: JobWriteCall): JobWriteRoute {
  // Each entry of JOB_WRITE_ROUTES takes its own endpoint's parameters; the union is narrowed by `endpoint`.
  const route = JOB_WRITE_ROUTES[call.endpoint] as (params: JobWriteCall['params']) => JobWriteRoute;
  return route(call.params);
}

const NO_PARAMS: Record<string, never> = {};

/** Reads a path queued by an earlier version of the app (method + path string) back into a call. */
export function callFromLegacyPath(method: string, path: string, body: unknown): JobWriteCall | undefined {
  const parts = path.split('/').filter(Boolean).map(decodeURIComponent);
  const [a, b, c, d, e] = parts;
  const record = body as never;
  switch (`${method} ${parts.length}`) {
    case 'PATCH 0':
      return { endpoint: 'updateJob', params: NO_PARAMS, body: record };
    case 'POST 1':
      if (a === 'status') return { endpoint: 'changeStatus', params: NO_PARAMS, body: record };
      if (a === 'zones') return { endpoint: 'createZone', params: NO_PARAMS, body: record };
      if (a === 'items') return { endpoint: 'createItem', params: NO_PARAMS, body: record };
      if (a === 'runs') return { endpoint: 'createRun', params: NO_PARAMS, body: record };
      if (a === 'checks') return { endpoint: 'createCheck', params: NO_PARAMS, body: record };
      return undefined;
    case 'PATCH 2':
      return a === 'zones' ? { endpoint: 'updateZone', params: { zoneId: b! }, body: record } : undefined;
    case 'PUT 2':
      if (a === 'items') return { endpoint: 'replaceItem', params: { itemId: b! }, body: record };
      if (a === 'runs') return { endpoint: 'replaceRun', params: { runId: b! }, body: record };
      if (a === 'checks') return { endpoint: 'replaceCheck', params: { checkId: b! }, body: record };
      if (a === 'signatures') return { endpoint: 'saveSignature', params: { role: b as SignatureRole }, body: record };
      return undefined;
    case 'DELETE 2':
      if (a === 'zones') return { endpoint: 'deleteZone', params: { zoneId: b! } };
      if (a === 'items') return { endpoint: 'deleteItem', params: { itemId: b! } };
      if (a === 'runs') return { endpoint: 'deleteRun', params: { runId: b! } };
      if (a === 'checks') return { endpoint: 'deleteCheck', params: { checkId: b! } };
      if (a === 'site-changes') return { endpoint: 'undoSiteChange', params: { recordId: b! } };
      if (a === 'signatures') return { endpoint: 'clearSignature', params: { role: b as SignatureRole } };
      return undefined;
    case 'POST 3':
      return a === 'runs' && c === 'depth-readings' ? { endpoint: 'addDepthReading', params: { runId: b! }, body: record } : undefined;
    case 'PATCH 4':
      return a === 'runs' && c === 'depth-readings' ? { endpoint: 'updateDepthReading', params: { runId: b!, readingId: d! }, body: record } : undefined;
    case 'DELETE 4':
      return a === 'runs' && c === 'depth-readings' ? { endpoint: 'deleteDepthReading', params: { runId: b!, readingId: d! } } : undefined;
    case 'PUT 5':
      return a === 'items' && c === 'channels' && e === 'setup'
        ? { endpoint: 'updateChannelSetup', params: { itemId: b!, channelId: d! }, body: record }
        : undefined;
    default:
      return undefined;
  }
}
