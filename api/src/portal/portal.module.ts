import { Module } from '@nestjs/common';

import { LocateModule } from '../locate/locate.module.js';
import { PacketsModule } from '../packets/packets.module.js';
import { PortalController } from './portal.controller.js';
import { PortalRepository } from './portal.repository.js';
import { PortalService } from './portal.service.js';

@Module({
  imports: [PacketsModule, LocateModule],
  controllers: [PortalController],
  providers: [PortalService, PortalRepository],
})
export class PortalModule {}
