import { Global, Inject, Logger, Module, type OnApplicationShutdown } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';

import type { Env } from '../config/env.schema.js';
import { DiskStorage } from './disk-storage.js';
import { OBJECT_STORAGE, type ObjectStorage } from './object-storage.js';
import { S3Storage } from './s3-storage.js';

const STORAGE_SETTINGS = [
  'STORAGE_DRIVER',
  'UPLOADS_DIR',
  'S3_BUCKET',
  'S3_REGION',
  'S3_ENDPOINT',
  'S3_ACCESS_KEY_ID',
  'S3_SECRET_ACCESS_KEY',
  'S3_FORCE_PATH_STYLE',
] as const;

export type StorageSettings = Pick<Env, (typeof STORAGE_SETTINGS)[number]>;

/** The driver chosen by STORAGE_DRIVER (disk under UPLOADS_DIR by default, or S3-compatible). */
export function createObjectStorage(env: StorageSettings): ObjectStorage {
  if (env.STORAGE_DRIVER === 's3') {
    // env.schema.ts refuses STORAGE_DRIVER=s3 without a bucket; this keeps the type narrow.
    if (!env.S3_BUCKET) throw new Error('S3_BUCKET is required when STORAGE_DRIVER=s3');
    return new S3Storage({
      bucket: env.S3_BUCKET,
      region: env.S3_REGION,
      endpoint: env.S3_ENDPOINT,
      accessKeyId: env.S3_ACCESS_KEY_ID,
      secretAccessKey: env.S3_SECRET_ACCESS_KEY,
      forcePathStyle: env.S3_FORCE_PATH_STYLE,
    });
  }
  return new DiskStorage(env.UPLOADS_DIR);
}

@Global()
@Module({
  providers: [
    {
      provide: OBJECT_STORAGE,
      inject: [ConfigService],
      useFactory: (config: ConfigService<Env, true>): ObjectStorage => {
        const settings = Object.fromEntries(
          STORAGE_SETTINGS.map((name) => [name, config.get(name, { infer: true })]),
        ) as StorageSettings;
        const storage = createObjectStorage(settings);
        new Logger('Storage').log(
          storage instanceof DiskStorage ? `disk storage under ${storage.root}` : `S3 storage in bucket ${settings.S3_BUCKET ?? ''}`,
        );
        return storage;
      },
    },
  ],
  exports: [OBJECT_STORAGE],
})
export class StorageModule implements OnApplicationShutdown {
  constructor(@Inject(OBJECT_STORAGE) private readonly storage: ObjectStorage) {}

  onApplicationShutdown(): void {
    if (this.storage instanceof S3Storage) this.storage.close();
  }
}
