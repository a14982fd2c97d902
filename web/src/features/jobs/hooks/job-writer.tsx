import {
  Button,
  Dialog,
  DialogActions,
  DialogBody,
  DialogContent,
  DialogSurface,
  DialogTitle,
  makeStyles,
  Spinner,
} from '@fluentui/react-components';
import { useQueryClient } from '@tanstack/react-query';
import {
  createContext,
  useCallback,
  useContext,
  useEffect,
  useMemo,
  useRef,
  useState,
  useSyncExternalStore,
  type ReactNode,
} from 'react';

import { useNotify } from '../../../components/notify';
import { isApiError } from '../../../lib/api-client';
import { clearDraft } from '../../../lib/drafts';
import { describeRequestError } from '../../../lib/form-errors';
import { getJobAsBuiltQueryOptions, type JobAsBuiltResponse, jobKeys } from '../../job-record';
import { applySiteVersions, getSiteQueryOptions, siteVersionOf, type SiteVersionResponse } from '../../sites';
import { sendJobWrite, siteOf, versionAfter, type JobWrite, type JobWriteResponse } from '../api/send-job-write';
import { withLocalId, withOfflineRecord } from '../utils/offline-records';
import { enqueuePendingWrite, newIdempotencyKey, readPendingWrites, subscribePendingWrites, type PendingWrite } from '../utils/pending-writes';
import { handleConflictsOf, isWorthRetrying, replayPendingWrites } from '../utils/replay-pending-writes';

const useStyles = makeStyles({ action: { minHeight: '48px' } });

/** What `save` did with a write. */
export type SaveOutcome = 'saved' | 'queued' | 'conflict';

/**
 * What `saveWithResult` did: with the server's answer when it was saved at once, and with the id the
 * record goes by on this device when it was queued (a create: a reference point made offline is taped
 * from under that id until the server names it).
 */
export type SaveResult = { outcome: SaveOutcome; response?: JobWriteResponse; localId?: string };

type JobWriter = {
  /**
   * Saves `write` on top of the job version this screen has. Resolves `saved` (the findings are
   * refreshed), `queued` (no connection: it waits in this browser and is sent when the connection
   * returns) or `conflict` (someone saved first: a dialog asks what to do). Rejects with the
   * `ApiError` for anything else (validation, permission), for the form to show.
   */
  save: (write: JobWrite) => Promise<SaveOutcome>;
  /** `save`, telling also the server's answer (saved at once) or the local id (queued). */
  saveWithResult: (write: JobWrite) => Promise<SaveResult>;
  pending: PendingWrite[];
  /** Sends the waiting writes now. */
  retryPending: () => void;
  isSending: boolean;
};

const JobWriterContext = createContext<JobWriter | undefined>(undefined);

type Conflict = { write: JobWrite; currentVersion: number | undefined; resolve: (outcome: SaveOutcome) => void };

/** Provides `useJobWriter()` for one job and shows the "someone saved first" dialog. */
export function JobWriterProvider({ jobId, children }: { jobId: string; children: ReactNode }) {
  const styles = useStyles();
  const notify = useNotify();
  const queryClient = useQueryClient();
  // One key per job, so the callbacks below (and the replay as the job opens) do not change every render.
  const queryKey = useMemo(() => getJobAsBuiltQueryOptions(jobId).queryKey, [jobId]);
  const [conflict, setConflict] = useState<Conflict | undefined>();
  const [isResolving, setIsResolving] = useState(false);
  const [isSending, setIsSending] = useState(false);
  /** The latest `flush` (defined below), for `save` and the replay as the job opens. */
  const flushRef = useRef<() => Promise<void>>(async () => undefined);
  const pending = useSyncExternalStore(
    subscribePendingWrites,
    () => readPendingWrites(jobId),
    () => readPendingWrites(jobId),
  );

  const currentVersion = useCallback(
    () => queryClient.getQueryData<JobAsBuiltResponse>(queryKey)?.job.version ?? 0,
    [queryClient, queryKey],
  );

  const applyVersion = useCallback(
    (version: number | undefined) => {
      if (version === undefined) return;
      queryClient.setQueryData<JobAsBuiltResponse>(queryKey, (previous) =>
        previous ? { ...previous, job: { ...previous.job, version } } : previous,
      );
    },
    [queryClient, queryKey],
  );

  const refresh = useCallback(() => queryClient.invalidateQueries({ queryKey: jobKeys.all }), [queryClient]);

  /**
   * The version a write names: the job's, or for a write to the job's site (a reference point) the
   * site's, read first when this page has not (with no signal that fails, and the write is queued).
   */
  const versionFor = useCallback(
    async (write: JobWrite): Promise<number> => {
      const siteId = siteOf(write);
      if (siteId === undefined) return currentVersion();
      return siteVersionOf(queryClient, siteId) || (await queryClient.ensureQueryData(getSiteQueryOptions(siteId))).version;
    },
    [currentVersion, queryClient],
  );

  const send = useCallback(
    async (write: JobWrite, version: number): Promise<JobWriteResponse> => {
      const response = await sendJobWrite(jobId, version, write);
      const siteId = siteOf(write);
      if (siteId !== undefined) {
        // The site's new version (and every job it bumped, this one included) kept; its points read again.
        applySiteVersions(queryClient, siteId, response as Partial<SiteVersionResponse>);
        void queryClient.invalidateQueries({ queryKey: getSiteQueryOptions(siteId).queryKey });
      }
      applyVersion(versionAfter(response, jobId));
      if (write.draftKey) clearDraft(write.draftKey);
      return response;
    },
    [applyVersion, jobId, queryClient],
  );

  const saveWithResult = useCallback(
    async (unkeyed: JobWrite): Promise<SaveResult> => {
      // One key per change, before the first attempt: if this attempt reaches the server but its answer
      // is lost, the queued copy sent later is recognised and not written twice.
      const write: JobWrite = { ...unkeyed, idempotencyKey: unkeyed.idempotencyKey ?? newIdempotencyKey() };
      const version = currentVersion();
      // Kept on this device; a new record shows at once under a local id, so more can be built on it.
      const queue = async (): Promise<SaveResult> => {
        const queued = withLocalId(write);
        await enqueuePendingWrite(jobId, queued, version);
        queryClient.setQueryData<JobAsBuiltResponse>(queryKey, (previous) => withOfflineRecord(previous, queued));
        return { outcome: 'queued', ...(queued.localId ? { localId: queued.localId } : {}) };
      };
      // Writes still waiting go first: this one may build on them (a run to a speaker added offline).
      if (readPendingWrites(jobId).length > 0) {
        const result = await queue();
        void flushRef.current();
        return result;
      }
      const sendNow = async (siteVersion?: number): Promise<SaveResult> => {
        const response = await send(write, siteVersion ?? (await versionFor(write)));
        await refresh();
        return { outcome: 'saved', response };
      };
      try {
        try {
          return await sendNow();
        } catch (error) {
          // A new reference point replaces nobody's: sent again on the site's version the conflict names.
          const newer = isApiError(error) && error.code === 'VERSION_CONFLICT' ? error.currentVersion : undefined;
          if (siteOf(write) === undefined || newer === undefined) throw error;
          return await sendNow(newer);
        }
      } catch (error) {
        if (isWorthRetrying(error)) return queue();
        if (isApiError(error) && error.code === 'VERSION_CONFLICT') {
          return new Promise<SaveResult>((resolve) =>
            setConflict({ write, currentVersion: error.currentVersion, resolve: (outcome) => resolve({ outcome }) }),
          );
        }
        throw error;
      }
    },
    [currentVersion, jobId, queryClient, queryKey, refresh, send, versionFor],
  );

  const save = useCallback(async (write: JobWrite): Promise<SaveOutcome> => (await saveWithResult(write)).outcome, [saveWithResult]);

  // Queued writes of this job that meet someone else's change ask here, whoever started the replay
  // (this page, or the app shell coming back online).
  useEffect(
    () =>
      handleConflictsOf(
        jobId,
        (write, version) => new Promise<void>((resolve) => setConflict({ write, currentVersion: version, resolve: () => resolve() })),
      ),
    [jobId],
  );

  /** Sends this job's waiting writes now (the app shell also does, on every page, when the signal returns). */
  const flush = useCallback(async () => {
    if (readPendingWrites(jobId).length === 0) return;
    setIsSending(true);
    try {
      const { sent } = await replayPendingWrites(jobId, {
        send: (_jobId, version, write) => send(write, version),
        knownVersion: () => queryClient.getQueryData<JobAsBuiltResponse>(queryKey)?.job.version,
        knownSiteVersion: (siteId) =>
          siteVersionOf(queryClient, siteId) ||
          queryClient
            .ensureQueryData(getSiteQueryOptions(siteId))
            .then((site) => site.version)
            .catch(() => undefined),
        onRefused: (write, error) => notify.error(`Could not save: ${write.label}`, describeRequestError(error)),
      });
      if (sent > 0) {
        notify.success(sent === 1 ? 'Sent the change made offline' : `Sent ${sent} changes made offline`);
        await refresh();
      }
    } finally {
      setIsSending(false);
    }
  }, [jobId, notify, queryClient, queryKey, refresh, send]);

  // Anything kept from an earlier visit goes out (or asks about a conflict) as the job opens; once per
  // job, not on every render (the shell tries again when the signal returns).
  flushRef.current = flush;
  useEffect(() => {
    void flushRef.current();
  }, [jobId]);

  const resolveConflict = async (choice: 'reload' | 'keep') => {
    if (!conflict) return;
    setIsResolving(true);
    try {
      await queryClient.refetchQueries({ queryKey, exact: true });
      const siteId = siteOf(conflict.write);
      if (siteId !== undefined) await queryClient.refetchQueries({ queryKey: getSiteQueryOptions(siteId).queryKey, exact: true });
      if (choice === 'reload') {
        if (conflict.write.draftKey) clearDraft(conflict.write.draftKey);
        conflict.resolve('conflict');
        notify.success('Showing the latest version', 'Your change was discarded.');
      } else {
        await send(conflict.write, await versionFor(conflict.write));
        await refresh();
        conflict.resolve('saved');
        notify.success('Saved on top of the latest version');
      }
      setConflict(undefined);
    } catch (error) {
      if (isApiError(error) && error.code === 'VERSION_CONFLICT') return; // Someone saved again: ask again.
      notify.error('Could not save your change', describeRequestError(error));
      conflict.resolve('conflict');
      setConflict(undefined);
    } finally {
      setIsResolving(false);
    }
  };

  const value = useMemo<JobWriter>(
    () => ({ save, saveWithResult, pending, retryPending: () => void flush(), isSending }),
    [flush, isSending, pending, save, saveWithResult],
  );

  return (
    <JobWriterContext.Provider value={value}>
      {children}
      <Dialog open={conflict !== undefined} modalType="alert">
        <DialogSurface>
          <DialogBody>
            <DialogTitle>Someone saved this job first</DialogTitle>
            <DialogContent>
              {conflict?.currentVersion !== undefined
                ? `The job changed (it is now at version ${conflict.currentVersion}) while you were working on: ${conflict.write.label}. `
                : `The job changed while you were working on: ${conflict?.write.label ?? ''}. `}
              Keep your change and save it on top of the latest version, or drop it and see what is there now.
            </DialogContent>
            <DialogActions fluid>
              <Button className={styles.action} disabled={isResolving} onClick={() => void resolveConflict('reload')}>
                Reload, discard mine
              </Button>
              <Button
                appearance="primary"
                className={styles.action}
                disabled={isResolving}
                icon={isResolving ? <Spinner size="tiny" /> : undefined}
                onClick={() => void resolveConflict('keep')}
              >
                Keep mine and save
              </Button>
            </DialogActions>
          </DialogBody>
        </DialogSurface>
      </Dialog>
    </JobWriterContext.Provider>
  );
}

export function useJobWriter(): JobWriter {
  const writer = useContext(JobWriterContext);
  if (!writer) throw new Error('useJobWriter needs a JobWriterProvider');
  return writer;
}
