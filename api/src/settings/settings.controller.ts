import { Body, Controller, Get, Patch, UseInterceptors } from '@nestjs/common';
import { ApiBearerAuth, ApiOperation, ApiTags } from '@nestjs/swagger';

import { ApiContract } from '../common/api-contract.decorator.js';
import { ContentEtagInterceptor } from '../common/content-etag.js';
import { type AuthUser, CurrentUser } from '../common/decorators/current-user.decorator.js';
import { Roles } from '../common/decorators/roles.decorator.js';
import { ZodValidationPipe } from '../common/zod-validation.pipe.js';
import {
  type CompanySettingsResponse,
  CompanySettingsResponseSchema,
  type MyPreferencesResponse,
  MyPreferencesResponseSchema,
  type UpdateCompanySettingsInput,
  UpdateCompanySettingsSchema,
  type UpdateMyPreferencesInput,
  UpdateMyPreferencesSchema,
} from '../domain/settings/settings.schema.js';
import { SettingsService } from './settings.service.js';

/** The company's defaults: everyone of the company reads them (they set how the app shows values); the admin changes them. */
@ApiTags('settings')
@ApiBearerAuth()
@Controller('company/settings')
export class CompanySettingsController {
  constructor(private readonly settings: SettingsService) {}

  @Get()
  @UseInterceptors(ContentEtagInterceptor)
  @ApiOperation({ summary: 'The company’s default units (lengths, wire sizes) and the paper its packets print on' })
  @ApiContract({ responses: { 200: CompanySettingsResponseSchema } })
  get(@CurrentUser() user: AuthUser): Promise<CompanySettingsResponse> {
    return this.settings.companySettings(user);
  }

  @Patch()
  @Roles('admin')
  @ApiOperation({ summary: 'Change the company’s defaults (admin); values are always stored in SI units whatever is shown' })
  @ApiContract({ body: UpdateCompanySettingsSchema, responses: { 200: CompanySettingsResponseSchema } })
  update(
    @CurrentUser() user: AuthUser,
    @Body(new ZodValidationPipe(UpdateCompanySettingsSchema)) body: UpdateCompanySettingsInput,
  ): Promise<CompanySettingsResponse> {
    return this.settings.updateCompanySettings(user, body);
  }
}

/** The signed-in person's own choices; `null` follows the company's default. */
@ApiTags('settings')
@ApiBearerAuth()
@Controller('me/preferences')
export class MyPreferencesController {
  constructor(private readonly settings: SettingsService) {}

  @Get()
  @UseInterceptors(ContentEtagInterceptor)
  @ApiOperation({ summary: 'Your own unit choices, the company defaults, and the units the app shows you (`effective`)' })
  @ApiContract({ responses: { 200: MyPreferencesResponseSchema } })
  get(@CurrentUser() user: AuthUser): Promise<MyPreferencesResponse> {
    return this.settings.myPreferences(user);
  }

  @Patch()
  @ApiOperation({ summary: 'Choose your own units; `null` goes back to the company’s default' })
  @ApiContract({ body: UpdateMyPreferencesSchema, responses: { 200: MyPreferencesResponseSchema } })
  update(
    @CurrentUser() user: AuthUser,
    @Body(new ZodValidationPipe(UpdateMyPreferencesSchema)) body: UpdateMyPreferencesInput,
  ): Promise<MyPreferencesResponse> {
    return this.settings.updateMyPreferences(user, body);
  }
}
