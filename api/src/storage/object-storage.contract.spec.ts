import { createHash } from 'node:crypto';
import { mkdtemp, readdir, rm } from 'node:fs/promises';
import { createRequire } from 'node:module';
import type { AddressInfo } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Readable } from 'node:stream';

import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { DiskStorage } from './disk-storage.js';
import { InvalidObjectKeyError } from './object-keys.js';
import { ObjectNotFoundError, type ObjectStorage } from './object-storage.js';
import { S3Storage } from './s3-storage.js';

/** The part of s3rver 3.7 (untyped CommonJS, root devDependency) this suite uses. */
interface S3rverInstance {
  run(): Promise<AddressInfo>;
  close(): Promise<void>;
}
type S3rverConstructor = new (options: Record<string, unknown>) => S3rverInstance;
const S3rver = createRequire(import.meta.url)('s3rver') as S3rverConstructor;

async function readAll(stream: Readable): Promise<Buffer> {
  const chunks: Buffer[] = [];
  for await (const chunk of stream) chunks.push(Buffer.from(chunk as Uint8Array));
  return Buffer.concat(chunks);
}

const sha256 = (bytes: Buffer) => createHash('sha256').update(bytes).digest('hex');

interface Driver {
  storage: ObjectStorage;
  close(): Promise<void>;
}

/** The same behaviour, whichever driver is configured: the packet renderer and photos rely on it. */
function objectStorageContract(name: string, open: () => Promise<Driver>) {
  describe(`ObjectStorage contract: ${name}`, () => {
    let driver: Driver;
    let sut: ObjectStorage;

    beforeAll(async () => {
      driver = await open();
      sut = driver.storage;
    });
    afterAll(async () => {
      await driver?.close();
    });

    it('should store bytes and report their size, SHA-256 and content type', async () => {
      const body = Buffer.from('trench at 18 in, tape visible');
      const stored = await sut.put('companies/c1/jobs/j1/photos/p1/original.jpg', body, 'image/jpeg');
      expect(stored).toEqual({
        key: 'companies/c1/jobs/j1/photos/p1/original.jpg',
        bytes: body.length,
        sha256: sha256(body),
        contentType: 'image/jpeg',
      });
      expect(await sut.getBuffer(stored.key)).toEqual(body);
      expect(await readAll(await sut.getStream(stored.key))).toEqual(body);
      expect(await sut.exists(stored.key)).toBe(true);
    });

    it('should round-trip binary data of a few megabytes unchanged', async () => {
      const body = Buffer.alloc(3 * 1024 * 1024 + 17);
      for (let i = 0; i < body.length; i += 1) body[i] = (i * 31 + 7) & 0xff;
      const stored = await sut.put('big/blob.bin', body, 'application/octet-stream');
      expect(stored.bytes).toBe(body.length);
      expect(sha256(await sut.getBuffer('big/blob.bin'))).toBe(sha256(body));
      expect(sha256(await readAll(await sut.getStream('big/blob.bin')))).toBe(sha256(body));
    });

    it('should store an empty object', async () => {
      await sut.put('empty/zero.txt', Buffer.alloc(0), 'text/plain');
      expect(await sut.getBuffer('empty/zero.txt')).toEqual(Buffer.alloc(0));
      expect(await sut.exists('empty/zero.txt')).toBe(true);
    });

    it('should replace an object written twice under the same key', async () => {
      await sut.put('overwrite/a.txt', Buffer.from('first'), 'text/plain');
      await sut.put('overwrite/a.txt', Buffer.from('second, longer'), 'text/plain');
      expect((await sut.getBuffer('overwrite/a.txt')).toString()).toBe('second, longer');
    });

    it('should reject reads of an absent key with ObjectNotFoundError', async () => {
      await expect(sut.getBuffer('nothing/here.jpg')).rejects.toBeInstanceOf(ObjectNotFoundError);
      await expect(sut.getStream('nothing/here.jpg')).rejects.toBeInstanceOf(ObjectNotFoundError);
      await expect(sut.getBuffer('nothing/here.jpg')).rejects.toMatchObject({ key: 'nothing/here.jpg' });
      expect(await sut.exists('nothing/here.jpg')).toBe(false);
    });

    it('should delete an object, and treat deleting an absent one as done', async () => {
      await sut.put('gone/soon.txt', Buffer.from('x'), 'text/plain');
      await sut.put('gone/stays.txt', Buffer.from('y'), 'text/plain');
      await sut.delete('gone/soon.txt');
      expect(await sut.exists('gone/soon.txt')).toBe(false);
      await expect(sut.getBuffer('gone/soon.txt')).rejects.toBeInstanceOf(ObjectNotFoundError);
      await expect(sut.delete('gone/soon.txt')).resolves.toBeUndefined();
      expect(await sut.exists('gone/stays.txt')).toBe(true);
    });

    it('should not treat a key prefix ("folder") as an object', async () => {
      await sut.put('prefix/inner/file.txt', Buffer.from('z'), 'text/plain');
      expect(await sut.exists('prefix/inner')).toBe(false);
      await expect(sut.getBuffer('prefix/inner')).rejects.toBeInstanceOf(ObjectNotFoundError);
    });

    it.each([
      '../escape.txt',
      'a/../../escape.txt',
      'a/../b.txt',
      './a.txt',
      '/etc/passwd',
      'a//b.txt',
      'a/b/',
      'a\\..\\b.txt',
      'a/\0.txt',
      '',
      '..',
      'a/.hidden/..',
    ])('should refuse the key %j on every operation', async (key) => {
      await expect(sut.put(key, Buffer.from('x'), 'text/plain')).rejects.toBeInstanceOf(InvalidObjectKeyError);
      await expect(sut.getBuffer(key)).rejects.toBeInstanceOf(InvalidObjectKeyError);
      await expect(sut.getStream(key)).rejects.toBeInstanceOf(InvalidObjectKeyError);
      await expect(sut.exists(key)).rejects.toBeInstanceOf(InvalidObjectKeyError);
      await expect(sut.delete(key)).rejects.toBeInstanceOf(InvalidObjectKeyError);
    });

    it('should keep concurrent writes to different keys apart', async () => {
      const keys = Array.from({ length: 12 }, (_, i) => `parallel/${i}.bin`);
      await Promise.all(keys.map((key, i) => sut.put(key, Buffer.alloc(1000 + i, i), 'application/octet-stream')));
      for (const [i, key] of keys.entries()) expect(await sut.getBuffer(key)).toEqual(Buffer.alloc(1000 + i, i));
    });
  });
}

const temps: string[] = [];
async function tempDir(prefix: string): Promise<string> {
  const dir = await mkdtemp(join(tmpdir(), prefix));
  temps.push(dir);
  return dir;
}
afterAll(async () => {
  await Promise.all(temps.map((dir) => rm(dir, { recursive: true, force: true })));
});

objectStorageContract('disk', async () => {
  const root = await tempDir('loamline-disk-');
  return { storage: new DiskStorage(join(root, 'uploads')), close: async () => {} };
});

objectStorageContract('s3 (s3rver)', async () => {
  const directory = await tempDir('loamline-s3rver-');
  const server = new S3rver({
    address: '127.0.0.1',
    port: 0,
    silent: true,
    directory,
    configureBuckets: [{ name: 'loamline-test', configs: [] }],
  });
  const { port } = await server.run();
  const storage = new S3Storage({
    bucket: 'loamline-test',
    region: 'us-east-1',
    endpoint: `http://127.0.0.1:${port}`,
    accessKeyId: 'S3RVER',
    secretAccessKey: 'S3RVER',
    forcePathStyle: true,
  });
  return {
    storage,
    close: async () => {
      storage.close();
      await server.close();
    },
  };
});

describe(DiskStorage.name, () => {
  it('should write atomically: no temporary files are left beside the object', async () => {
    const root = await tempDir('loamline-disk-atomic-');
    const sut = new DiskStorage(root);
    await sut.put('a/b/c.txt', Buffer.from('hello'), 'text/plain');
    await sut.put('a/b/c.txt', Buffer.from('hello again'), 'text/plain');
    expect(await readdir(join(root, 'a/b'))).toEqual(['c.txt']);
  });

  it('should resolve keys strictly inside its root', async () => {
    const root = await tempDir('loamline-disk-root-');
    const sut = new DiskStorage(root);
    expect(sut.pathOf('x/y.jpg')).toBe(join(root, 'x/y.jpg'));
    expect(() => sut.pathOf('../y.jpg')).toThrow(InvalidObjectKeyError);
  });
});
