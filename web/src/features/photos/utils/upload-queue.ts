import type { PhotoTarget, UploadPhotosResponse } from '@domain/photos/photo.schema';

import { isApiError } from '../../../lib/api-client';
import type { UploadProgress } from '../../../lib/upload';
import type { QueuedUpload, UploadQueueStore } from '../../../lib/upload-queue-store';

/**
 * Where one file is: waiting its turn; going out (`loaded` of `total` bytes); failed in a way that may
 * pass (no connection, server busy) and tried again at `retryAt` (`null`: when the connection
 * returns); refused for good with the server's reason; or stored as `photoId`.
 */
export type UploadStatus =
  | { kind: 'waiting' }
  | { kind: 'uploading'; loaded: number; total: number }
  | { kind: 'retrying'; attempt: number; retryAt: number | null; reason: string }
  | { kind: 'failed'; reason: string }
  | { kind: 'done'; photoId: string };

export type UploadEntry = QueuedUpload & { status: UploadStatus };

/** Sends one queued file as a change to `version` of its job. */
export type UploadSender = (
  upload: QueuedUpload,
  version: number,
  options: { onProgress: (progress: UploadProgress) => void; signal: AbortSignal },
) => Promise<UploadPhotosResponse>;

export type UploadQueueDeps = {
  store: UploadQueueStore;
  send: UploadSender;
  /** The job's version now (asked before each upload, so a stale screen does not cost a wasted upload). */
  getVersion: (jobId: string) => Promise<number>;
  isOnline?: () => boolean;
  /** Milliseconds before retry number `attempt` (1-based). */
  backoffMs?: (attempt: number) => number;
  now?: () => number;
  newId?: () => string;
};

/** 2 s, 4 s, 8 s … capped at a minute, with a little jitter so a crew's phones do not retry in step. */
export function defaultBackoffMs(attempt: number): number {
  const base = Math.min(60_000, 2_000 * 2 ** (attempt - 1));
  return Math.round(base * (0.85 + Math.random() * 0.3));
}

/**
 * Statuses worth trying again unchanged: no answer, a timeout, too many requests, a server error, or a
 * job that kept changing under the upload (the crew's offline changes replaying as the signal returns):
 * a photo changes nobody's record, so it waits a little and goes on top of whatever version is then.
 */
function isTransient(error: unknown): boolean {
  if (!isApiError(error)) return true;
  if (error.code === 'VERSION_CONFLICT') return true;
  return error.status === 0 || error.status === 408 || error.status === 429 || error.status >= 500;
}

const MAX_VERSION_RETRIES = 5;

export type UploadedListener = (entry: UploadEntry, response: UploadPhotosResponse) => void;

/**
 * The photo upload queue: files are stored (IndexedDB) as soon as they are picked, then sent one at a
 * time (the server holds a request's files in memory; one at a time keeps that flat and a retry
 * cheap). A dropped connection or a server error is retried with growing pauses, and at once when
 * the browser says it is back online; a refusal (415, 413, 403…) stops with the server's reason
 * until the crew retries or discards it. A version conflict is retried on the job's new version at
 * once: adding a photo changes nobody's record. The same `clientUploadId` goes with every attempt,
 * so an attempt whose answer was lost is answered by the server with the photo it already stored.
 */
export class UploadQueue {
  private entries: UploadEntry[] = [];
  private readonly listeners = new Set<() => void>();
  private readonly uploadedListeners = new Set<UploadedListener>();
  private isPumping = false;
  private timer: ReturnType<typeof setTimeout> | undefined;
  private current: { id: string; controller: AbortController } | undefined;
  private started: Promise<void> | undefined;
  private readonly deps: Required<UploadQueueDeps>;

  constructor(deps: UploadQueueDeps) {
    this.deps = {
      isOnline: () => (typeof navigator === 'undefined' ? true : navigator.onLine),
      backoffMs: defaultBackoffMs,
      now: () => Date.now(),
      newId: () => `u-${crypto.randomUUID()}`,
      ...deps,
    };
  }

  /** Loads what a previous page left in the store and starts sending it. Safe to call more than once. */
  start(): Promise<void> {
    this.started ??= this.deps.store
      .list()
      .catch(() => [] as QueuedUpload[])
      .then((stored) => {
        const known = new Set(this.entries.map((entry) => entry.id));
        const resumed = stored
          .filter((upload) => !known.has(upload.id))
          .map<UploadEntry>((upload) => ({
            ...upload,
            status: upload.failure ? { kind: 'failed', reason: upload.failure } : { kind: 'waiting' },
          }));
        this.entries = [...resumed, ...this.entries];
        this.emit();
        this.pump();
      });
    return this.started;
  }

  /** The browser is back online: everything waiting for a retry goes now. */
  wake(): void {
    let changed = false;
    this.entries = this.entries.map((entry) => {
      if (entry.status.kind !== 'retrying') return entry;
      changed = true;
      return { ...entry, status: { ...entry.status, retryAt: this.deps.now() } };
    });
    if (changed) this.emit();
    this.pump();
  }

  /** Queues `files` for `jobId`, stored before anything is sent. Returns their ids (client upload ids). */
  async add(jobId: string, files: readonly File[], options: { target: PhotoTarget; caption?: string | null }): Promise<string[]> {
    const now = this.deps.now();
    const added = files.map<UploadEntry>((file, index) => ({
      id: this.deps.newId(),
      jobId,
      target: options.target,
      caption: options.caption?.trim() ? options.caption.trim() : null,
      file,
      name: file.name || `photo-${index + 1}`,
      // One millisecond apart, so a batch comes back from the store in the order it was picked.
      queuedAt: new Date(now + index).toISOString(),
      status: { kind: 'waiting' },
    }));
    this.entries = [...this.entries, ...added];
    this.emit();
    // A full or unavailable store still lets the photos go out now; they only lose the reload safety.
    await Promise.all(added.map((entry) => this.deps.store.put(toStored(entry)).catch(() => undefined)));
    this.pump();
    return added.map((entry) => entry.id);
  }

  /** Tries a failed or retrying upload again now. */
  async retry(id: string): Promise<void> {
    const entry = this.find(id);
    if (!entry || (entry.status.kind !== 'failed' && entry.status.kind !== 'retrying')) return;
    this.update(id, { kind: 'waiting' }, { failure: undefined });
    await this.deps.store.put(toStored({ ...entry, failure: undefined })).catch(() => undefined);
    this.pump();
  }

  /** Drops an upload that is not done (cancelling it if it is going out), or forgets a finished one. */
  async discard(id: string): Promise<void> {
    if (this.current?.id === id) this.current.controller.abort();
    this.entries = this.entries.filter((entry) => entry.id !== id);
    this.emit();
    await this.deps.store.delete(id).catch(() => undefined);
  }

  /** Forgets the finished uploads of `jobId` (their photos are in the gallery). */
  clearDone(jobId: string): void {
    this.entries = this.entries.filter((entry) => !(entry.jobId === jobId && entry.status.kind === 'done'));
    this.emit();
  }

  getSnapshot = (): readonly UploadEntry[] => this.entries;

  subscribe = (listener: () => void): (() => void) => {
    this.listeners.add(listener);
    return () => this.listeners.delete(listener);
  };

  /** Called once per stored photo, for the screens to refresh the gallery and the job version. */
  onUploaded(listener: UploadedListener): () => void {
    this.uploadedListeners.add(listener);
    return () => this.uploadedListeners.delete(listener);
  }

  /** Stops the retry timer (tests, sign-out). Stored uploads stay for the next start. */
  stop(): void {
    if (this.timer !== undefined) clearTimeout(this.timer);
    this.timer = undefined;
    this.current?.controller.abort();
  }

  private find(id: string): UploadEntry | undefined {
    return this.entries.find((entry) => entry.id === id);
  }

  private update(id: string, status: UploadStatus, patch: Partial<QueuedUpload> = {}): void {
    this.entries = this.entries.map((entry) => (entry.id === id ? { ...entry, ...patch, status } : entry));
    this.emit();
  }

  private emit(): void {
    for (const listener of this.listeners) listener();
  }

  private nextDue(): UploadEntry | undefined {
    const now = this.deps.now();
    return this.entries.find(
      (entry) =>
        entry.status.kind === 'waiting' || (entry.status.kind === 'retrying' && entry.status.retryAt !== null && entry.status.retryAt <= now),
    );
  }

  private pump(): void {
    if (this.isPumping) return;
    this.isPumping = true;
    void (async () => {
      try {
        for (let entry = this.nextDue(); entry; entry = this.nextDue()) await this.sendOne(entry);
      } finally {
        this.isPumping = false;
        this.schedule();
      }
    })();
  }

  /** Sets the timer for the earliest retry that has a time. */
  private schedule(): void {
    if (this.timer !== undefined) clearTimeout(this.timer);
    this.timer = undefined;
    const times = this.entries.flatMap((entry) => (entry.status.kind === 'retrying' && entry.status.retryAt !== null ? [entry.status.retryAt] : []));
    if (times.length === 0) return;
    const delay = Math.max(0, Math.min(...times) - this.deps.now());
    this.timer = setTimeout(() => {
      this.timer = undefined;
      this.pump();
    }, delay);
  }

  private async sendOne(entry: UploadEntry): Promise<void> {
    const attempt = entry.status.kind === 'retrying' ? entry.status.attempt : 0;
    const controller = new AbortController();
    this.current = { id: entry.id, controller };
    this.update(entry.id, { kind: 'uploading', loaded: 0, total: entry.file.size });
    try {
      let version = await this.deps.getVersion(entry.jobId);
      let response: UploadPhotosResponse | undefined;
      for (let conflicts = 0; response === undefined; conflicts += 1) {
        try {
          response = await this.deps.send(entry, version, {
            signal: controller.signal,
            onProgress: ({ loaded, total }) => {
              if (this.find(entry.id)?.status.kind === 'uploading') this.update(entry.id, { kind: 'uploading', loaded, total });
            },
          });
        } catch (error) {
          const isConflict = isApiError(error) && error.code === 'VERSION_CONFLICT';
          if (!isConflict || conflicts >= MAX_VERSION_RETRIES) throw error;
          version = error.currentVersion ?? (await this.deps.getVersion(entry.jobId));
        }
      }
      const photoId = response.photos[0]?.id ?? '';
      await this.deps.store.delete(entry.id).catch(() => undefined);
      if (!this.find(entry.id)) return; // Discarded while it was going out.
      this.update(entry.id, { kind: 'done', photoId });
      const done = this.find(entry.id)!;
      for (const listener of this.uploadedListeners) listener(done, response);
    } catch (error) {
      if (!this.find(entry.id) || (error instanceof DOMException && error.name === 'AbortError')) return;
      if (isTransient(error)) {
        const next = attempt + 1;
        const isOnline = this.deps.isOnline();
        this.update(entry.id, {
          kind: 'retrying',
          attempt: next,
          retryAt: isOnline ? this.deps.now() + this.deps.backoffMs(next) : null,
          reason: !isOnline ? 'No connection' : isApiError(error) ? error.message : 'The upload was interrupted.',
        });
        return;
      }
      const reason = isApiError(error) ? error.message : 'The upload failed.';
      this.update(entry.id, { kind: 'failed', reason }, { failure: reason });
      await this.deps.store.put(toStored({ ...entry, failure: reason })).catch(() => undefined);
    } finally {
      if (this.current?.id === entry.id) this.current = undefined;
    }
  }
}

function toStored(entry: UploadEntry | QueuedUpload): QueuedUpload {
  const { id, jobId, target, caption, file, name, queuedAt, failure } = entry;
  return { id, jobId, target, caption, file, name, queuedAt, ...(failure ? { failure } : {}) };
}
