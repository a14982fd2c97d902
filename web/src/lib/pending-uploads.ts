/**
 * How many photos wait to be sent on this device and for which jobs, for the header's "Waiting to send
 * (n)" (issue 17). The upload queue is its own chunk, loaded after the first page; it publishes here,
 * so the app frame can count photos without loading it.
 */
export type PendingUpload = { jobId: string; queuedAt: string };

const NONE: readonly PendingUpload[] = [];
let current: readonly PendingUpload[] = NONE;
const listeners = new Set<() => void>();

/** The photos waiting (queued, going out or waiting for a retry), oldest first; the same array until it changes. */
export function readPendingUploads(): readonly PendingUpload[] {
  return current;
}

/** Called by the upload queue whenever its list changes. */
export function publishPendingUploads(uploads: readonly PendingUpload[]): void {
  const same = uploads.length === current.length && uploads.every((upload, index) => upload.jobId === current[index]?.jobId && upload.queuedAt === current[index]?.queuedAt);
  if (same) return;
  current = uploads.length === 0 ? NONE : [...uploads];
  for (const listener of listeners) listener();
}

export function subscribePendingUploads(listener: () => void): () => void {
  listeners.add(listener);
  return () => listeners.delete(listener);
}
