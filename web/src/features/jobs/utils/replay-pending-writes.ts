import { isApiError } from '../../../lib/api-client';
import { isAdditiveEndpoint } from '../api/job-write-endpoints';
import { siteOf, versionAfter, type JobWrite, type JobWriteResponse } from '../api/send-job-write';

import { idsLearned, withServerIds } from './offline-records';
import { readAllPendingWrites, readPendingWrites, removePendingWrite, rewritePendingWrites } from './pending-writes';

/**
 * A failure that another try may get past: no connection (status 0), the server or its database busy
 * or down, a session that could not be refreshed with no signal, or the same change still being saved
 * (`IDEMPOTENCY_IN_PROGRESS`). Such a write is queued, never dropped.
 */
export function isWorthRetrying(error: unknown): boolean {
  if (!isApiError(error)) return false;
  if (error.status === 0 || error.status === 429 || error.status === 502 || error.status === 503 || error.status === 504) return true;
  return error.status === 409 && error.code === 'IDEMPOTENCY_IN_PROGRESS';
}

/**
 * Asks the crew what to do with a queued write someone else's change got in the way of (the job page's
 * conflict dialog); resolves once they have chosen and the choice is carried out.
 */
export type ConflictHandler = (write: JobWrite, currentVersion: number | undefined) => Promise<void>;

const conflictHandlers = new Map<string, ConflictHandler>();

/** The open job page answers conflicts of its job; elsewhere such a write waits for it. */
export function handleConflictsOf(jobId: string, handler: ConflictHandler): () => void {
  conflictHandlers.set(jobId, handler);
  return () => {
    if (conflictHandlers.get(jobId) === handler) conflictHandlers.delete(jobId);
  };
}

export type ReplayDeps = {
  /** Sends `write` on `version` of the job; resolves the server's answer. */
  send: (jobId: string, version: number, write: JobWrite) => Promise<JobWriteResponse>;
  /** The job version this device knows (the kept as-built), if any. */
  knownVersion: (jobId: string) => number | undefined;
  /**
   * The site version this device knows (the kept site, read first if it has none), for a write to the
   * job's site (a reference point).
   */
  knownSiteVersion?: (siteId: string) => number | undefined | Promise<number | undefined>;
  /** The server refused `write` for good (the job closed, a record deleted…); it is taken off the queue. */
  onRefused: (write: JobWrite, error: unknown) => void;
};

/** What a replay did: how many writes went out, and why it stopped early if it did. */
export type ReplayResult = { sent: number; stoppedBy?: 'no-signal' | 'conflict' };

const running = new Map<string, Promise<ReplayResult>>();

/**
 * Sends `jobId`'s queued writes in the order they were made, one at a time, each with its kept
 * idempotency key. Writes made one after another offline each built on the version before; once the
 * first lands, the next builds on the version it produced, since only this device wrote in between. A
 * write that only adds a record is sent on the job's version now, and once more on the version a
 * conflict names (it replaces nobody's record). Stops, keeping the order, on no signal or a busy
 * server; a conflict on a replacing write goes to the job page's dialog (`handleConflictsOf`) or, with
 * no job page open, waits there. One replay per job at a time: a second call joins the running one.
 * `sent` counts this call's writes only.
 */
export function replayPendingWrites(jobId: string, deps: ReplayDeps): Promise<ReplayResult> {
  const current = running.get(jobId);
  // Whoever started the replay reports what it sent; a caller that joins it only learns how it ended.
  if (current) return current.then(({ stoppedBy }) => (stoppedBy ? { sent: 0, stoppedBy } : { sent: 0 }));
  const replay = replayJob(jobId, deps).finally(() => running.delete(jobId));
  running.set(jobId, replay);
  return replay;
}

async function replayJob(jobId: string, deps: ReplayDeps): Promise<ReplayResult> {
  const rebased = new Map<number, number>();
  let sent = 0;
  for (const { id } of readPendingWrites(jobId)) {
    // Read again each time: an earlier write of this round may have rewritten it (server ids).
    const entry = readPendingWrites(jobId).find((candidate) => candidate.id === id);
    if (!entry) continue;
    const base = rebased.get(entry.baseVersion) ?? entry.baseVersion;
    const isAdditive = isAdditiveEndpoint(entry.write.endpoint);
    // A write to the job's site (a reference point: only adds) goes on the site's version as it is now.
    const siteId = siteOf(entry.write);
    const version = siteId !== undefined ? ((await deps.knownSiteVersion?.(siteId)) ?? 0) : isAdditive ? (deps.knownVersion(jobId) ?? base) : base;
    try {
      let response: JobWriteResponse;
      try {
        response = await deps.send(jobId, version, entry.write);
      } catch (error) {
        const newer = isApiError(error) && error.code === 'VERSION_CONFLICT' ? error.currentVersion : undefined;
        if (!isAdditive || newer === undefined) throw error;
        response = await deps.send(jobId, newer, entry.write);
      }
      // A site write bumps the job too (its answer names the job's new version in jobVersions).
      const after = versionAfter(response, jobId);
      // A record created offline now has the server's id: the writes that build on it say so from now on.
      const learned = idsLearned(entry.write, response);
      if (learned.size > 0) await rewritePendingWrites(jobId, (write) => withServerIds(write, learned));
      if (after !== undefined) {
        rebased.set(entry.baseVersion, after);
        if (siteId === undefined) rebased.set(version, after);
      }
      await removePendingWrite(jobId, entry.id);
      sent += 1;
    } catch (error) {
      if (isWorthRetrying(error)) return { sent, stoppedBy: 'no-signal' };
      if (isApiError(error) && error.code === 'VERSION_CONFLICT') {
        const ask = conflictHandlers.get(jobId);
        if (!ask) return { sent, stoppedBy: 'conflict' };
        // The entry stays queued until the crew has chosen (a reload meanwhile asks again).
        await ask(entry.write, error.currentVersion);
        await removePendingWrite(jobId, entry.id);
        continue;
      }
      // Refused for good: said, not silently dropped.
      await removePendingWrite(jobId, entry.id);
      deps.onRefused(entry.write, error);
    }
  }
  return { sent };
}

/**
 * Replays every job's queue of the signed-in person, the job with the oldest waiting write first (the
 * app shell does this at start, when the browser is back online and now and then, on any page). A job
 * that stops on a conflict waits for its page; no signal stops the whole round.
 */
export async function replayAllPendingWrites(deps: ReplayDeps): Promise<ReplayResult> {
  const jobIds = [...new Set(readAllPendingWrites().map((entry) => entry.jobId))];
  let sent = 0;
  let stoppedBy: ReplayResult['stoppedBy'];
  for (const jobId of jobIds) {
    const result = await replayPendingWrites(jobId, deps);
    sent += result.sent;
    if (result.stoppedBy === 'no-signal') return { sent, stoppedBy: 'no-signal' };
    stoppedBy ??= result.stoppedBy;
  }
  return stoppedBy ? { sent, stoppedBy } : { sent };
}
