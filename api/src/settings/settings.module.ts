import { Module } from '@nestjs/common';

import { CompanySettingsController, MyPreferencesController } from './settings.controller.js';
import { SettingsRepository } from './settings.repository.js';
import { SettingsService } from './settings.service.js';

@Module({
  controllers: [CompanySettingsController, MyPreferencesController],
  providers: [SettingsService, SettingsRepository],
})
export class SettingsModule {}
