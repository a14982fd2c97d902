import { Module } from '@nestjs/common';

import { SitesModule } from '../sites/sites.module.js';
import { AsBuiltCache } from './as-built-cache.js';
import { DrawingRenderer } from './drawing-renderer.js';
import { JobDrawingsController } from './job-drawings.controller.js';
import { JobDrawingsService } from './job-drawings.service.js';
import { JobRecordsController } from './job-records.controller.js';
import { JobRecordModule } from './job-record.module.js';
import { JobRecordsService } from './job-records.service.js';
import { JobsController } from './jobs.controller.js';
import { JobsService } from './jobs.service.js';

@Module({
  imports: [SitesModule, JobRecordModule],
  controllers: [JobsController, JobRecordsController, JobDrawingsController],
  providers: [AsBuiltCache, JobsService, JobRecordsService, JobDrawingsService, DrawingRenderer],
})
export class JobsModule {}
