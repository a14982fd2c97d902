import { Module } from '@nestjs/common';

import { JobRecordsController } from './job-records.controller.js';
import { JobRecordsService } from './job-records.service.js';
import { JobWriter } from './job-writer.js';
import { JobsController } from './jobs.controller.js';
import { JobsRepository } from './jobs.repository.js';
import { JobsService } from './jobs.service.js';

@Module({
  controllers: [JobsController, JobRecordsController],
  providers: [JobsService, JobRecordsService, JobWriter, JobsRepository],
})
export class JobsModule {}
