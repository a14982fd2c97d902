import { useQueryClient } from '@tanstack/react-query';
import { useEffect, useMemo, useSyncExternalStore } from 'react';

import { publishPendingUploads } from '../../../lib/pending-uploads';
import { createIndexedDbUploadStore } from '../../../lib/upload-queue-store';
import { getJobAsBuiltQueryOptions, type JobAsBuiltResponse } from '../../job-record';
import { getJobPhotosQueryOptions } from '../api/get-job-photos';
import { getJobVersion } from '../api/get-job-version';
import { uploadPhoto } from '../api/upload-photo';
import { UploadQueue, type UploadEntry } from '../utils/upload-queue';

let instance: UploadQueue | undefined;

/** The one upload queue of this page: it outlives screens, so photos keep going while the crew moves on. */
export function getUploadQueue(): UploadQueue {
  instance ??= new UploadQueue({ store: createIndexedDbUploadStore(), send: uploadPhoto, getVersion: getJobVersion });
  return instance;
}

/** Replaces the queue (tests). */
export function setUploadQueue(queue: UploadQueue | undefined): void {
  instance?.stop();
  instance = queue;
}

/**
 * Runs the queue for the signed-in area: resumes what a previous page left in IndexedDB, sends again
 * when the browser comes back online, and refreshes the gallery and the job version as photos land.
 */
export function useUploadQueueRunner(): void {
  const queryClient = useQueryClient();
  useEffect(() => {
    const queue = getUploadQueue();
    // The header counts photos still to send beside the job changes ("Waiting to send (n)").
    const publish = () => publishPendingUploads(queue.getSnapshot().filter(isStillToSend));
    const stopPublishing = queue.subscribe(publish);
    publish();
    void queue.start();
    const wake = () => queue.wake();
    window.addEventListener('online', wake);
    const stopListening = queue.onUploaded((entry, response) => {
      queryClient.setQueryData<JobAsBuiltResponse>(getJobAsBuiltQueryOptions(entry.jobId).queryKey, (previous) =>
        previous && previous.job.version < response.jobVersion ? { ...previous, job: { ...previous.job, version: response.jobVersion } } : previous,
      );
      void queryClient.invalidateQueries({ queryKey: getJobPhotosQueryOptions(entry.jobId).queryKey });
    });
    return () => {
      window.removeEventListener('online', wake);
      stopListening();
      stopPublishing();
    };
  }, [queryClient]);
}

/** Waiting, going out or waiting for a retry; not refused (the crew decides) and not done. */
function isStillToSend(entry: UploadEntry): boolean {
  return entry.status.kind === 'waiting' || entry.status.kind === 'uploading' || entry.status.kind === 'retrying';
}

const NONE: readonly UploadEntry[] = [];

/** The uploads of `jobId` (all of them, finished ones included, oldest first). */
export function useJobUploads(jobId: string): readonly UploadEntry[] {
  const queue = getUploadQueue();
  const all = useSyncExternalStore(queue.subscribe, queue.getSnapshot, () => NONE);
  return useMemo(() => all.filter((entry) => entry.jobId === jobId), [all, jobId]);
}
