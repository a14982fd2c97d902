import { Module } from '@nestjs/common';

import { ImageWorkModule } from '../common/image-work.module.js';
import { UsersModule } from '../users/users.module.js';
import { PlanImageProcessor } from './plan-image-processor.js';
import { PlanImageUploadInterceptor } from './plan-image-upload.interceptor.js';
import { SiteFeaturesController } from './site-features.controller.js';
import { SiteFeaturesRepository } from './site-features.repository.js';
import { SiteFeaturesService } from './site-features.service.js';
import { SiteHomeownersController } from './site-homeowners.controller.js';
import { SiteHomeownersService } from './site-homeowners.service.js';
import { SitePlanImageController } from './site-plan-image.controller.js';
import { SitePlanImagesService } from './site-plan-images.service.js';
import { SiteVersionsRepository } from './site-versions.repository.js';
import { SiteWriter } from './site-writer.js';
import { SitesController } from './sites.controller.js';
import { SitesRepository } from './sites.repository.js';
import { SitesService } from './sites.service.js';

@Module({
  // Homeowners without an account are invited through the users' invitation flow.
  imports: [UsersModule, ImageWorkModule],
  controllers: [SitesController, SitePlanImageController, SiteHomeownersController, SiteFeaturesController],
  providers: [
    SitesService,
    SitesRepository,
    SitePlanImagesService,
    PlanImageProcessor,
    PlanImageUploadInterceptor,
    SiteHomeownersService,
    SiteVersionsRepository,
    SiteWriter,
    SiteFeaturesService,
    SiteFeaturesRepository,
  ],
  // The drawing routes of a job put the site's plan image underneath; SiteWriter versions every site write.
  exports: [SitePlanImagesService, SiteWriter, SiteFeaturesRepository],
})
export class SitesModule {}
