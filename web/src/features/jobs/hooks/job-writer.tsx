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
import { getJobAsBuiltQueryOptions, type JobAsBuiltResponse } from '../../job-record';
import { isAdditiveEndpoint } from '../api/job-write-endpoints';
import { sendJobWrite, versionAfter, type JobWrite } from '../api/send-job-write';
import {
  enqueuePendingWrite,
  newIdempotencyKey,
  readPendingWrites,
  removePendingWrite,
  subscribePendingWrites,
  type PendingWrite,
} from '../utils/pending-writes';

const useStyles = makeStyles({ action: { minHeight: '48px' } });

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

/** What `save` did with a write. */
export type SaveOutcome = 'saved' | 'queued' | 'conflict';

type JobWriter = {
  /**
   * Saves `write` on top of the job version this screen has. Resolves `saved` (the findings are
   * refreshed), `queued` (no connection: it waits in this browser and is sent when the connection
   * returns) or `conflict` (someone saved first: a dialog asks what to do). Rejects with the
   * `ApiError` for anything else (validation, permission), for the form to show.
   */
  save: (write: JobWrite) => Promise<SaveOutcome>;
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
  const queryKey = getJobAsBuiltQueryOptions(jobId).queryKey;
  const [conflict, setConflict] = useState<Conflict | undefined>();
  const [isResolving, setIsResolving] = useState(false);
  const [isSending, setIsSending] = useState(false);
  const flushing = useRef(false);
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

  const refresh = useCallback(() => queryClient.invalidateQueries({ queryKey: ['jobs'] }), [queryClient]);

  const send = useCallback(
    async (write: JobWrite, version: number): Promise<void> => {
      const response = await sendJobWrite(jobId, version, write);
      applyVersion(versionAfter(response));
      if (write.draftKey) clearDraft(write.draftKey);
    },
    [applyVersion, jobId],
  );

  const save = useCallback(
    async (unkeyed: JobWrite): Promise<SaveOutcome> => {
      // One key per change, before the first attempt: if this attempt reaches the server but its answer
      // is lost, the queued copy sent later is recognised and not written twice.
      const write: JobWrite = { ...unkeyed, idempotencyKey: unkeyed.idempotencyKey ?? newIdempotencyKey() };
      const version = currentVersion();
      try {
        await send(write, version);
        await refresh();
        return 'saved';
      } catch (error) {
        if (isWorthRetrying(error)) {
          await enqueuePendingWrite(jobId, write, version);
          return 'queued';
        }
        if (isApiError(error) && error.code === 'VERSION_CONFLICT') {
          return new Promise<SaveOutcome>((resolve) =>
            setConflict({ write, currentVersion: error.currentVersion, resolve }),
          );
        }
        throw error;
      }
    },
    [currentVersion, jobId, refresh, send],
  );

  const flush = useCallback(async () => {
    if (flushing.current) return;
    const queue = readPendingWrites(jobId);
    if (queue.length === 0) return;
    flushing.current = true;
    setIsSending(true);
    // Writes made one after another offline each built on the version before; once the first lands,
    // the next builds on the version it produced, since only this browser wrote in between.
    const rebased = new Map<number, number>();
    let sent = 0;
    try {
      for (const entry of queue) {
        const base = rebased.get(entry.baseVersion) ?? entry.baseVersion;
        const version = isAdditiveEndpoint(entry.write.endpoint) ? currentVersion() : base;
        try {
          const before = version;
          await send(entry.write, version);
          rebased.set(entry.baseVersion, currentVersion());
          rebased.set(before, currentVersion());
          await removePendingWrite(jobId, entry.id);
          sent += 1;
        } catch (error) {
          // No signal yet, the server busy, or this very change still being saved: stop here and keep
          // the order; the rest goes out on the next try.
          if (isWorthRetrying(error)) break;
          if (isApiError(error) && error.code === 'VERSION_CONFLICT') {
            // The entry stays queued until the crew has chosen (a reload meanwhile asks again).
            await new Promise<SaveOutcome>((resolve) => setConflict({ write: entry.write, currentVersion: error.currentVersion, resolve }));
            await removePendingWrite(jobId, entry.id);
          } else {
            // Refused for good (the job was closed, a record deleted…): said, not silently dropped.
            await removePendingWrite(jobId, entry.id);
            notify.error(`Could not save: ${entry.write.label}`, describeRequestError(error));
          }
        }
      }
    } finally {
      flushing.current = false;
      setIsSending(false);
      if (sent > 0) {
        notify.success(sent === 1 ? 'Sent the change made offline' : `Sent ${sent} changes made offline`);
        await refresh();
      }
    }
  }, [currentVersion, jobId, notify, refresh, send]);

  useEffect(() => {
    void flush();
    const onOnline = () => void flush();
    window.addEventListener('online', onOnline);
    // `online` is not always fired (captive portals, flaky radio); try again now and then.
    const timer = window.setInterval(() => {
      if (readPendingWrites(jobId).length > 0) void flush();
    }, 20_000);
    return () => {
      window.removeEventListener('online', onOnline);
      window.clearInterval(timer);
    };
  }, [flush, jobId]);

  const resolveConflict = async (choice: 'reload' | 'keep') => {
    if (!conflict) return;
    setIsResolving(true);
    try {
      await queryClient.refetchQueries({ queryKey, exact: true });
      if (choice === 'reload') {
        if (conflict.write.draftKey) clearDraft(conflict.write.draftKey);
        conflict.resolve('conflict');
        notify.success('Showing the latest version', 'Your change was discarded.');
      } else {
        await send(conflict.write, currentVersion());
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
    () => ({ save, pending, retryPending: () => void flush(), isSending }),
    [flush, isSending, pending, save],
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
