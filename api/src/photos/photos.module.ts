import { Module } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { MulterModule } from '@nestjs/platform-express';

import { ImageWorkModule } from '../common/image-work.module.js';
import type { Env } from '../config/env.schema.js';
import { JobRecordModule } from '../jobs/job-record.module.js';
import { JobPhotosController } from './job-photos.controller.js';
import { PhotoProcessor } from './photo-processor.js';
import { PhotosController } from './photos.controller.js';
import { PhotosService } from './photos.service.js';
import { UploadLimitsInterceptor } from './upload-limits.interceptor.js';

@Module({
  imports: [
    JobRecordModule,
    ImageWorkModule,
    // No storage engine: Multer keeps files in memory (bounded by these limits); the service writes
    // them to object storage under generated keys once they have been checked.
    MulterModule.registerAsync({
      inject: [ConfigService],
      useFactory: (config: ConfigService<Env, true>) => ({
        limits: {
          fileSize: config.get('UPLOAD_MAX_FILE_BYTES', { infer: true }),
          files: config.get('UPLOAD_MAX_FILES', { infer: true }),
          fields: 50,
          fieldSize: 64 * 1024,
        },
      }),
    }),
  ],
  controllers: [JobPhotosController, PhotosController],
  providers: [PhotosService, PhotoProcessor, UploadLimitsInterceptor],
})
export class PhotosModule {}
