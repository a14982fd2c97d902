import { Module } from '@nestjs/common';

import { SitesController } from './sites.controller.js';
import { SitesRepository } from './sites.repository.js';
import { SitesService } from './sites.service.js';

@Module({ controllers: [SitesController], providers: [SitesService, SitesRepository] })
export class SitesModule {}
