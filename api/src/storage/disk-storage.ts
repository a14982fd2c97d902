import { createHash, randomUUID } from 'node:crypto';
import { createReadStream } from 'node:fs';
import { mkdir, readFile, rename, rm, stat, writeFile } from 'node:fs/promises';
import { dirname, resolve, sep } from 'node:path';
import type { Readable } from 'node:stream';

import { assertSafeKey, InvalidObjectKeyError } from './object-keys.js';
import { ObjectNotFoundError, type ObjectStorage, type StoredObject } from './object-storage.js';

function isNotFound(error: unknown): boolean {
  const code = (error as NodeJS.ErrnoException | undefined)?.code;
  return code === 'ENOENT' || code === 'ENOTDIR' || code === 'EISDIR';
}

/**
 * Objects as files under one root folder. Writes go to a temporary file beside the target and are
 * renamed into place, so a reader never sees a half-written object and a crash leaves at most a
 * `*.tmp` file behind. The content type is not kept on disk: callers record it in the database.
 */
export class DiskStorage implements ObjectStorage {
  readonly root: string;

  constructor(root: string) {
    this.root = resolve(root);
  }

  /** The absolute path of a key; refuses keys that would land outside the root. */
  pathOf(key: string): string {
    assertSafeKey(key);
    const path = resolve(this.root, key);
    // Belt and braces on top of assertSafeKey: the resolved path must stay strictly inside the root.
    if (!path.startsWith(this.root + sep)) throw new InvalidObjectKeyError(key);
    return path;
  }

  async put(key: string, body: Buffer, contentType: string): Promise<StoredObject> {
    const path = this.pathOf(key);
    await mkdir(dirname(path), { recursive: true });
    const temp = `${path}.${randomUUID()}.tmp`;
    try {
      await writeFile(temp, body, { flag: 'wx' });
      await rename(temp, path);
    } catch (error) {
      await rm(temp, { force: true });
      throw error;
    }
    return { key, bytes: body.length, sha256: createHash('sha256').update(body).digest('hex'), contentType };
  }

  async getBuffer(key: string): Promise<Buffer> {
    try {
      return await readFile(this.pathOf(key));
    } catch (error) {
      if (isNotFound(error)) throw new ObjectNotFoundError(key);
      throw error;
    }
  }

  async getStream(key: string): Promise<Readable> {
    const path = this.pathOf(key);
    try {
      if (!(await stat(path)).isFile()) throw new ObjectNotFoundError(key);
      const stream = createReadStream(path);
      // Wait for the open so that an absent object rejects here rather than as a stream 'error' mid-response.
      await new Promise<void>((resolve, reject) => {
        stream.once('open', () => resolve());
        stream.once('error', reject);
      });
      return stream;
    } catch (error) {
      if (isNotFound(error)) throw new ObjectNotFoundError(key);
      throw error;
    }
  }

  async exists(key: string): Promise<boolean> {
    try {
      return (await stat(this.pathOf(key))).isFile();
    } catch (error) {
      if (isNotFound(error)) return false;
      throw error;
    }
  }

  /** Removes the object; deleting an absent key is not an error (deletes are retried after failures). */
  async delete(key: string): Promise<void> {
    await rm(this.pathOf(key), { force: true });
  }
}
