import { useQueryClient, type QueryClient } from '@tanstack/react-query';
import { useEffect } from 'react';

import { useNotify } from '../../../components/notify';
import { clearDraft } from '../../../lib/drafts';
import { describeRequestError } from '../../../lib/form-errors';
import { getJobAsBuiltQueryOptions, type JobAsBuiltResponse, jobKeys } from '../../job-record';
import type { SiteVersionResponse } from '../../sites';
import { sendJobWrite, siteOf, versionAfter } from '../api/send-job-write';
import { readAllPendingWrites } from '../utils/pending-writes';
import { replayAllPendingWrites, type ReplayDeps } from '../utils/replay-pending-writes';

/** How often to try again while writes wait: `online` is not always fired (captive portals, flaky radio). */
export const RETRY_EVERY_MS = 20_000;

/**
 * The sites feature, loaded only when a write to a site waits (a reference point made from a job): this
 * runner starts on every page, and most queues hold job writes only.
 */
const loadSites = () => import('../../sites');

/** Sends through the job's endpoint and keeps the version it answered with in the kept as-built. */
export function sendAndKeepVersion(queryClient: QueryClient): ReplayDeps['send'] {
  return async (jobId, version, write) => {
    const response = await sendJobWrite(jobId, version, write);
    const siteId = siteOf(write);
    if (siteId !== undefined) {
      // A reference point made from the job: the site's new version (and every job it bumped) kept, its list read again.
      const sites = await loadSites();
      sites.applySiteVersions(queryClient, siteId, response as Partial<SiteVersionResponse>);
      void queryClient.invalidateQueries({ queryKey: sites.getSiteQueryOptions(siteId).queryKey });
    }
    const after = versionAfter(response, jobId);
    if (after !== undefined) {
      queryClient.setQueryData<JobAsBuiltResponse>(getJobAsBuiltQueryOptions(jobId).queryKey, (previous) =>
        previous && previous.job.version < after ? { ...previous, job: { ...previous.job, version: after } } : previous,
      );
    }
    if (write.draftKey) clearDraft(write.draftKey);
    return response;
  };
}

/**
 * Sends the changes made with no signal from any page, not only from their job (issue 17): at start,
 * when the browser says it is back online, and every 20 seconds while some wait. A conflict waits for
 * its job's page, where the dialog asks (the "Waiting to send" link in the header leads there).
 */
export function useJobWritesRunner(): void {
  const queryClient = useQueryClient();
  const notify = useNotify();
  useEffect(() => {
    let sites: Awaited<ReturnType<typeof loadSites>> | undefined;
    const deps: ReplayDeps = {
      send: sendAndKeepVersion(queryClient),
      knownVersion: (jobId) => queryClient.getQueryData<JobAsBuiltResponse>(getJobAsBuiltQueryOptions(jobId).queryKey)?.job.version,
      knownSiteVersion: async (siteId) => {
        if (!sites) return undefined;
        const kept = sites.siteVersionOf(queryClient, siteId);
        if (kept) return kept;
        // Not read on this device yet: read it now (with no signal this fails and the write waits).
        return (await queryClient.ensureQueryData(sites.getSiteQueryOptions(siteId)).catch(() => undefined))?.version;
      },
      onRefused: (write, error) => notify.error(`Could not save: ${write.label}`, describeRequestError(error)),
    };
    const run = async () => {
      const waiting = readAllPendingWrites();
      if (waiting.length === 0) return;
      if (!sites && waiting.some((entry) => siteOf(entry.write) !== undefined)) sites = await loadSites();
      const { sent } = await replayAllPendingWrites(deps);
      if (sent > 0) {
        notify.success(sent === 1 ? 'Sent the change made offline' : `Sent ${sent} changes made offline`);
        await queryClient.invalidateQueries({ queryKey: jobKeys.all });
      }
    };
    const onOnline = () => void run();
    void run();
    window.addEventListener('online', onOnline);
    const timer = window.setInterval(onOnline, RETRY_EVERY_MS);
    return () => {
      window.removeEventListener('online', onOnline);
      window.clearInterval(timer);
    };
  }, [notify, queryClient]);
}
