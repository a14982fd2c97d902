import { apiRequest } from '../../../lib/api-client';

import { responseOf } from '../../../lib/response';

/**
 * One change to a job or its records, in a form that can wait in IndexedDB while there is no
 * connection and be sent again later (utils/pending-writes.ts).
 */
export type JobWrite = {
  method: 'POST' | 'PUT' | 'PATCH' | 'DELETE';
  /** Below `/api/jobs/:jobId`, e.g. `/runs/<id>/depth-readings`; '' for the job itself. */
  path: string;
  body?: unknown;
  /**
   * Adds something new (a depth reading, a check, an item) without replacing anyone's record, so it
   * may be re-sent on top of whatever version the job has reached.
   */
  isAdditive?: boolean;
  /** The draft this write saves; dropped once the server has it. */
  draftKey?: string;
  /** Plain words for lists and dialogs: "Depth reading on Patio trunk". */
  label: string;
  /**
   * Sent as `Idempotency-Key`: made once before the first attempt and kept with the queued write, so
   * a change whose answer was lost is written once however often it is sent again.
   */
  idempotencyKey?: string;
};

/** The answer of a write: records answer `jobVersion`, job-level writes the whole job with `version`. */
export type JobWriteResponse = { jobVersion?: number; version?: number } & Record<string, unknown>;

/** Sends `write` as a change to `version` of the job (`If-Match`). */
export function sendJobWrite(jobId: string, version: number, write: JobWrite): Promise<JobWriteResponse> {
  return apiRequest(`/api/jobs/${encodeURIComponent(jobId)}${write.path}`, responseOf<JobWriteResponse>(), {
    method: write.method,
    body: write.body,
    headers: { 'If-Match': `"${version}"`, ...(write.idempotencyKey ? { 'Idempotency-Key': write.idempotencyKey } : {}) },
  }).then((response) => response ?? {});
}

/** The job version a write answered with. */
export function versionAfter(response: JobWriteResponse): number | undefined {
  return typeof response.jobVersion === 'number' ? response.jobVersion : typeof response.version === 'number' ? response.version : undefined;
}
