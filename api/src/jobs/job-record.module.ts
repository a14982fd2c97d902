import { Module } from '@nestjs/common';

import { PhotosRepository } from '../photos/photos.repository.js';
import { JobWriter } from './job-writer.js';
import { JobsRepository } from './jobs.repository.js';

/**
 * The job record's shared kernel: reading a job and its children (JobsRepository, PhotosRepository) and
 * writing them the one way every job write goes (JobWriter: lock, rules, If-Match, version, audit).
 * Jobs, photos, packets and the packet renderer import it, so the application holds one instance of
 * each (the repository keeps prepared statements) instead of a copy per module. Needs the global
 * DbModule and AuditModule.
 */
@Module({
  providers: [JobsRepository, JobWriter, PhotosRepository],
  exports: [JobsRepository, JobWriter, PhotosRepository],
})
export class JobRecordModule {}
