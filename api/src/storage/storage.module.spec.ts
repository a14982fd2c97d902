import { resolve } from 'node:path';

import { describe, expect, it } from 'vitest';

import { readEnv } from '../config/env.schema.js';
import { DiskStorage } from './disk-storage.js';
import { S3Storage } from './s3-storage.js';
import { createObjectStorage } from './storage.module.js';

const base = { DATABASE_URL: 'postgres://x@127.0.0.1/x', JWT_ACCESS_SECRET: 'x'.repeat(32) };

describe(createObjectStorage.name, () => {
  it('should default to the disk driver under .data/uploads', () => {
    const sut = createObjectStorage(readEnv(base));
    expect(sut).toBeInstanceOf(DiskStorage);
    expect((sut as DiskStorage).root).toBe(resolve('.data/uploads'));
  });

  it('should use UPLOADS_DIR for the disk driver', () => {
    const sut = createObjectStorage(readEnv({ ...base, UPLOADS_DIR: '/tmp/loamline-elsewhere' }));
    expect((sut as DiskStorage).root).toBe('/tmp/loamline-elsewhere');
  });

  it('should build the S3 driver from the S3_* settings', async () => {
    const sut = createObjectStorage(
      readEnv({
        ...base,
        STORAGE_DRIVER: 's3',
        S3_BUCKET: 'loamline-photos',
        S3_ENDPOINT: 'http://127.0.0.1:9000',
        S3_FORCE_PATH_STYLE: 'true',
        S3_ACCESS_KEY_ID: 'id',
        S3_SECRET_ACCESS_KEY: 'secret',
      }),
    );
    expect(sut).toBeInstanceOf(S3Storage);
    const s3 = sut as S3Storage;
    expect(s3.bucket).toBe('loamline-photos');
    expect(s3.client.config.forcePathStyle).toBe(true);
    expect(await s3.client.config.region()).toBe('us-east-1');
    s3.close();
  });

  it('should refuse STORAGE_DRIVER=s3 without a bucket, naming the variable', () => {
    expect(() => readEnv({ ...base, STORAGE_DRIVER: 's3' })).toThrow(/S3_BUCKET/);
  });

  it('should read S3_FORCE_PATH_STYLE=false as false', () => {
    expect(readEnv({ ...base, S3_FORCE_PATH_STYLE: 'false' }).S3_FORCE_PATH_STYLE).toBe(false);
  });
});
