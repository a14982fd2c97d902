import type { Readable } from 'node:stream';

/** Injection token of the configured ObjectStorage driver (local disk or S3-compatible). */
export const OBJECT_STORAGE = Symbol('OBJECT_STORAGE');

export interface StoredObject {
  key: string;
  bytes: number;
  /** Hex SHA-256 of the stored bytes. */
  sha256: string;
  contentType: string;
}

/**
 * Where uploads, photo derivatives, packets and archives live. Keys are relative paths such as
 * `companies/<id>/photos/<id>/original.jpg`; drivers must refuse keys that escape their root.
 */
export interface ObjectStorage {
  put(key: string, body: Buffer, contentType: string): Promise<StoredObject>;
  /** The object's bytes; rejects with `ObjectNotFoundError` when absent. */
  getBuffer(key: string): Promise<Buffer>;
  /** A stream of the object's bytes; rejects with `ObjectNotFoundError` when absent. */
  getStream(key: string): Promise<Readable>;
  exists(key: string): Promise<boolean>;
  delete(key: string): Promise<void>;
}

export class ObjectNotFoundError extends Error {
  constructor(readonly key: string) {
    super(`no stored object at ${key}`);
    this.name = 'ObjectNotFoundError';
  }
}
