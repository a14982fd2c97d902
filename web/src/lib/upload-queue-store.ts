import type { PhotoTarget } from '@domain/photos/photo.schema';

/** A photo waiting to be sent, with everything needed to send it again after a reload. */
export type QueuedUpload = {
  /** Also the `clientUploadId`: made once when queued, kept across retries so the server stores one copy. */
  id: string;
  jobId: string;
  target: PhotoTarget;
  caption: string | null;
  file: Blob;
  name: string;
  queuedAt: string;
  /** Set when the server refused it for good (415, 413, 403…); kept so the crew sees why after a reload. */
  failure?: string;
};

/** Where queued photos live until the server has them. */
export interface UploadQueueStore {
  /** Every stored upload, oldest first. */
  list(): Promise<QueuedUpload[]>;
  put(upload: QueuedUpload): Promise<void>;
  delete(id: string): Promise<void>;
}

const DB_NAME = 'loamline-uploads';
const STORE = 'uploads';

/** Keeps uploads in memory only (tests, and browsers without IndexedDB such as some private modes). */
export function createMemoryUploadStore(initial: QueuedUpload[] = []): UploadQueueStore {
  const uploads = new Map(initial.map((upload) => [upload.id, upload]));
  return {
    list: async () => [...uploads.values()].sort((a, b) => a.queuedAt.localeCompare(b.queuedAt)),
    put: async (upload) => {
      uploads.set(upload.id, upload);
    },
    delete: async (id) => {
      uploads.delete(id);
    },
  };
}

function request<T>(req: IDBRequest<T>): Promise<T> {
  return new Promise((resolve, reject) => {
    req.onsuccess = () => resolve(req.result);
    req.onerror = () => reject(req.error ?? new Error('IndexedDB request failed'));
  });
}

/**
 * Keeps uploads, Blob and all, in IndexedDB so they survive a reload, a crash or a closed tab. Falls
 * back to memory when IndexedDB cannot be opened.
 */
export function createIndexedDbUploadStore(): UploadQueueStore {
  if (typeof indexedDB === 'undefined') return createMemoryUploadStore();
  let opened: Promise<IDBDatabase> | undefined;
  const open = () => {
    opened ??= new Promise<IDBDatabase>((resolve, reject) => {
      const req = indexedDB.open(DB_NAME, 1);
      req.onupgradeneeded = () => {
        if (!req.result.objectStoreNames.contains(STORE)) req.result.createObjectStore(STORE, { keyPath: 'id' });
      };
      req.onsuccess = () => resolve(req.result);
      req.onerror = () => reject(req.error ?? new Error('Cannot open IndexedDB'));
    });
    return opened;
  };
  const withStore = async <T>(mode: IDBTransactionMode, work: (store: IDBObjectStore) => IDBRequest<T>): Promise<T> => {
    const db = await open();
    const tx = db.transaction(STORE, mode);
    const result = await request(work(tx.objectStore(STORE)));
    await new Promise<void>((resolve, reject) => {
      tx.oncomplete = () => resolve();
      tx.onabort = tx.onerror = () => reject(tx.error ?? new Error('IndexedDB transaction failed'));
    });
    return result;
  };
  return {
    list: async () => {
      const all = (await withStore('readonly', (store) => store.getAll())) as QueuedUpload[];
      return all.sort((a, b) => a.queuedAt.localeCompare(b.queuedAt));
    },
    put: async (upload) => {
      await withStore('readwrite', (store) => store.put(upload));
    },
    delete: async (id) => {
      await withStore('readwrite', (store) => store.delete(id));
    },
  };
}
