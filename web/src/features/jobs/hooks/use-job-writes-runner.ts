import { useQueryClient, type QueryClient } from '@tanstack/react-query';
import { useEffect } from 'react';

import { useNotify } from '../../../components/notify';
import { clearDraft } from '../../../lib/drafts';
import { describeRequestError } from '../../../lib/form-errors';
import { getJobAsBuiltQueryOptions, type JobAsBuiltResponse, jobKeys } from '../../job-record';
import { sendJobWrite, versionAfter } from '../api/send-job-write';
import { readAllPendingWrites } from '../utils/pending-writes';
import { replayAllPendingWrites, type ReplayDeps } from '../utils/replay-pending-writes';

/** How often to try again while writes wait: `online` is not always fired (captive portals, flaky radio). */
export const RETRY_EVERY_MS = 20_000;

/** Sends through the job's endpoint and keeps the version it answered with in the kept as-built. */
export function sendAndKeepVersion(queryClient: QueryClient): ReplayDeps['send'] {
  return async (jobId, version, write) => {
    const response = await sendJobWrite(jobId, version, write);
    const after = versionAfter(response);
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
    const deps: ReplayDeps = {
      send: sendAndKeepVersion(queryClient),
      knownVersion: (jobId) => queryClient.getQueryData<JobAsBuiltResponse>(getJobAsBuiltQueryOptions(jobId).queryKey)?.job.version,
      onRefused: (write, error) => notify.error(`Could not save: ${write.label}`, describeRequestError(error)),
    };
    const run = async () => {
      if (readAllPendingWrites().length === 0) return;
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
