import { Body, Controller, Delete, Get, Patch, Put, Req, Res, UploadedFile, UseInterceptors } from '@nestjs/common';
import { FileInterceptor } from '@nestjs/platform-express';
import { ApiBearerAuth, ApiOperation, ApiResponse, ApiTags } from '@nestjs/swagger';
import type { Request, Response } from 'express';

import { ApiContract, fileResponse, multipartBody } from '../common/api-contract.decorator.js';
import { ContentEtagInterceptor } from '../common/content-etag.js';
import { type AuthUser, CurrentUser } from '../common/decorators/current-user.decorator.js';
import { Roles } from '../common/decorators/roles.decorator.js';
import { ZodValidationPipe } from '../common/zod-validation.pipe.js';
import {
  type CompanyDepthRulesResponse,
  CompanyDepthRulesResponseSchema,
  type CompanyProfileResponse,
  CompanyProfileResponseSchema,
  LOGO_MAX_BYTES,
  type UpdateCompanyProfileInput,
  UpdateCompanyProfileSchema,
  type UpdateDepthRulesInput,
  UpdateDepthRulesSchema,
} from '../domain/company/company-profile.schema.js';
import { CompanyProfileService, type UploadedLogoFile } from './company-profile.service.js';
import { LogoUploadInterceptor } from './logo-upload.interceptor.js';

/** The company profile: the admin fills it in, the office reads it. */
@ApiTags('settings')
@ApiBearerAuth()
@Controller('company/profile')
export class CompanyProfileController {
  constructor(private readonly profiles: CompanyProfileService) {}

  @Get()
  @UseInterceptors(ContentEtagInterceptor)
  @Roles('admin', 'office')
  @ApiOperation({ summary: 'The company profile: trade name, contact, licences, time zone, locale and logo' })
  @ApiContract({ responses: { 200: CompanyProfileResponseSchema } })
  get(@CurrentUser() user: AuthUser): Promise<CompanyProfileResponse> {
    return this.profiles.profile(user);
  }

  @Patch()
  @Roles('admin')
  @ApiOperation({
    summary: 'Change the company profile (admin); `null` or blank clears an optional field',
    description: 'The time zone is an IANA name (`America/Denver`), the locale a BCP 47 tag (`en-US`); both are checked with Intl.',
  })
  @ApiContract({ body: UpdateCompanyProfileSchema, responses: { 200: CompanyProfileResponseSchema } })
  update(@CurrentUser() user: AuthUser, @Body(new ZodValidationPipe(UpdateCompanyProfileSchema)) body: UpdateCompanyProfileInput): Promise<CompanyProfileResponse> {
    return this.profiles.update(user, body);
  }

  @Put('logo')
  @Roles('admin')
  @ApiOperation({
    summary: 'Upload or replace the logo (PNG, JPEG or WebP, sniffed from the bytes, at most 5 MB)',
    description: 'Stored as a PNG without metadata, longest side at most 600 px. Packets already issued keep the logo they were issued with.',
  })
  @ApiResponse({ status: 413, description: 'Larger than 5 MB, or more pixels than UPLOAD_MAX_INPUT_PIXELS' })
  @ApiResponse({ status: 415, description: 'Not a PNG, JPEG or WebP image (SVG included)' })
  @UseInterceptors(LogoUploadInterceptor, FileInterceptor('file', { limits: { fileSize: LOGO_MAX_BYTES, files: 1, fields: 10 } }))
  @ApiContract({ body: multipartBody({ file: 'one' }), responses: { 200: CompanyProfileResponseSchema } })
  uploadLogo(@CurrentUser() user: AuthUser, @UploadedFile() file: UploadedLogoFile | undefined): Promise<CompanyProfileResponse> {
    return this.profiles.uploadLogo(user, file);
  }

  @Get('logo')
  @Roles('admin', 'office')
  @ApiOperation({ summary: 'The company logo as stored (PNG)' })
  @ApiContract({ responses: { 200: fileResponse('image/png', 'image/jpeg', 'image/webp') } })
  async logo(@CurrentUser() user: AuthUser, @Req() req: Request, @Res() res: Response): Promise<void> {
    const content = await this.profiles.logo(user);
    res.set({ ETag: content.etag, 'Cache-Control': 'private, max-age=0, must-revalidate', Vary: 'Authorization' });
    if (req.headers['if-none-match'] === content.etag) {
      res.status(304).end();
      return;
    }
    res.set({ 'Content-Type': 'image/png', 'Content-Length': String(content.body.length), 'X-Content-Type-Options': 'nosniff' });
    res.end(content.body);
  }

  @Delete('logo')
  @Roles('admin')
  @ApiOperation({ summary: 'Remove the logo from the profile (packets already issued keep theirs)' })
  @ApiContract({ responses: { 200: CompanyProfileResponseSchema } })
  removeLogo(@CurrentUser() user: AuthUser): Promise<CompanyProfileResponse> {
    return this.profiles.removeLogo(user);
  }
}

/** The depth rules the findings cite: per installation method and location, with the shipped defaults beside them. */
@ApiTags('settings')
@ApiBearerAuth()
@Controller('company/depth-rules')
export class CompanyDepthRulesController {
  constructor(private readonly profiles: CompanyProfileService) {}

  @Get()
  @UseInterceptors(ContentEtagInterceptor)
  @Roles('admin', 'office')
  @ApiOperation({ summary: 'The company’s depth rule table (its own, or the shipped defaults) and the defaults with their basis' })
  @ApiContract({ responses: { 200: CompanyDepthRulesResponseSchema } })
  get(@CurrentUser() user: AuthUser): Promise<CompanyDepthRulesResponse> {
    return this.profiles.depthRules(user);
  }

  @Put()
  @Roles('admin')
  @ApiOperation({ summary: 'Replace the company’s depth rule table (admin); minimum cover in metres, `null` = not checked' })
  @ApiContract({ body: UpdateDepthRulesSchema, responses: { 200: CompanyDepthRulesResponseSchema } })
  update(@CurrentUser() user: AuthUser, @Body(new ZodValidationPipe(UpdateDepthRulesSchema)) body: UpdateDepthRulesInput): Promise<CompanyDepthRulesResponse> {
    return this.profiles.updateDepthRules(user, body);
  }

  @Delete()
  @Roles('admin')
  @ApiOperation({ summary: 'Go back to the shipped default depth rules (admin)' })
  @ApiContract({ responses: { 200: CompanyDepthRulesResponseSchema } })
  reset(@CurrentUser() user: AuthUser): Promise<CompanyDepthRulesResponse> {
    return this.profiles.resetDepthRules(user);
  }
}
