import { Module } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { MulterModule } from '@nestjs/platform-express';

import { ImageWorkModule } from '../common/image-work.module.js';
import type { Env } from '../config/env.schema.js';
import { JobWriter } from '../jobs/job-writer.js';
import { JobsRepository } from '../jobs/jobs.repository.js';
import { JobPhotosController } from './job-photos.controller.js';
import { PhotoProcessor } from './photo-processor.js';
import { PhotosController } from './photos.controller.js';
import { PhotosRepository } from './photos.repository.js';
import { PhotosService } from './photos.service.js';
import { UploadLimitsInterceptor } from './upload-limits.interceptor.js';

@Module({
  imports: [
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
  // JobWriter and JobsRepository are stateless: this module gets its own instances rather than
  // widening JobsModule's exports, and writes go through the same locking, rules and audit.
  providers: [PhotosService, PhotosRepository, PhotoProcessor, UploadLimitsInterceptor, JobWriter, JobsRepository],
})
export class PhotosModule {}
