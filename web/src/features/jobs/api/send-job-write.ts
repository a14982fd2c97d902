import { apiRequest } from '../../../lib/api-client';

import { JOB_WRITE_RESPONSES, routeOf, type JobWriteCall, type JobWriteResponse } from './job-write-endpoints';

export type { JobWriteResponse };

/**
 * One change to a job or its records, in a form that can wait in IndexedDB while there is no
 * connection and be sent again later (utils/pending-writes.ts): the endpoint by name with its
 * parameters and body (job-write-endpoints.ts), never a path string.
 */
export type JobWrite = JobWriteCall & {
  /** The draft this write saves; dropped once the server has it. */
  draftKey?: string;
  /** Plain words for lists and dialogs: "Depth reading on Patio trunk". */
  label: string;
  /**
   * Sent as `Idempotency-Key`: made once before the first attempt and kept with the queued write, so
   * a change whose answer was lost is written once however often it is sent again.
   */
  idempotencyKey?: string;
  /**
   * For a record created with no signal: the id it goes by on this device until the server names it
   * (later writes made offline may point at it: a run to a speaker added offline). Replay swaps it.
   */
  localId?: string;
};

/**
 * Sends `write` as a change to `version` of the job (`If-Match`); a write to the job's site
 * (`siteOf(write)`) goes to the site instead, and `version` is then the site's.
 */
export function sendJobWrite(jobId: string, version: number, write: JobWrite): Promise<JobWriteResponse> {
  const route = routeOf(write);
  const base = route.siteId ? `/api/sites/${encodeURIComponent(route.siteId)}` : `/api/jobs/${encodeURIComponent(jobId)}`;
  return apiRequest(`${base}${route.path}`, JOB_WRITE_RESPONSES[write.endpoint], {
    method: route.method,
    body: write.body,
    headers: { 'If-Match': `"${version}"`, ...(write.idempotencyKey ? { 'Idempotency-Key': write.idempotencyKey } : {}) },
  });
}

/** The site a write goes to (its version is the one `If-Match` names), or undefined for a write to the job. */
export function siteOf(write: JobWrite): string | undefined {
  return routeOf(write).siteId;
}

/**
 * The job version a write answered with. A site write answers the site's version and the new version
 * of every open job on the site it bumped (`jobVersions`): then `jobId`'s, when it is one of them.
 */
export function versionAfter(response: JobWriteResponse, jobId?: string): number | undefined {
  if (typeof response.jobVersion === 'number') return response.jobVersion;
  if (typeof response.version === 'number') return response.version;
  const bumped = response.jobVersions as Record<string, unknown> | undefined;
  const version = jobId !== undefined && bumped && typeof bumped === 'object' ? bumped[jobId] : undefined;
  return typeof version === 'number' ? version : undefined;
}
