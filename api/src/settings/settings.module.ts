import { Module } from '@nestjs/common';

import { CompanyDepthRulesController, CompanyProfileController } from './company-profile.controller.js';
import { CompanyProfileRepository } from './company-profile.repository.js';
import { CompanyProfileService } from './company-profile.service.js';
import { LogoProcessor } from './logo-processor.js';
import { LogoUploadInterceptor } from './logo-upload.interceptor.js';
import { CompanySettingsController, MyPreferencesController } from './settings.controller.js';
import { SettingsRepository } from './settings.repository.js';
import { SettingsService } from './settings.service.js';

@Module({
  controllers: [CompanySettingsController, MyPreferencesController, CompanyProfileController, CompanyDepthRulesController],
  providers: [SettingsService, SettingsRepository, CompanyProfileService, CompanyProfileRepository, LogoProcessor, LogoUploadInterceptor],
  exports: [CompanyProfileRepository],
})
export class SettingsModule {}
