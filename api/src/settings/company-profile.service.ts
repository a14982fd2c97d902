import { createHash } from 'node:crypto';

import { Inject, Injectable, Logger } from '@nestjs/common';

import { AuditService } from '../audit/audit.service.js';
import type { AuthUser } from '../common/decorators/current-user.decorator.js';
import type {
  CompanyDepthRulesResponse,
  CompanyProfileResponse,
  UpdateCompanyProfileInput,
  UpdateDepthRulesInput,
} from '../domain/company/company-profile.schema.js';
import { NotFoundError, ValidationError } from '../domain/errors.js';
import type { DepthRuleTable } from '../domain/depth/depth-rules.schema.js';
import { DEFAULT_DEPTH_RULES } from '../domain/depth/depth-rules.js';
import { OBJECT_STORAGE, type ObjectStorage } from '../storage/object-storage.js';
import { type CompanyProfilePatch, type CompanyProfileRow, CompanyProfileRepository } from './company-profile.repository.js';
import { LogoProcessor } from './logo-processor.js';

/** The part of a Multer file the service uses (memory storage). */
export interface UploadedLogoFile {
  buffer: Buffer;
  size: number;
}

export interface LogoContent {
  body: Buffer;
  etag: string;
}

const LOGO_PREFIX = (companyId: string) => `companies/${companyId}/logo/`;

/** The part of the logo's key that changes with the picture (its SHA-256 prefix), for URLs and ETags. */
function logoVersion(key: string): string {
  return key.split('/').pop()!.replace(/\.png$/, '').slice(0, 16);
}

export function toProfileResponse(row: CompanyProfileRow): CompanyProfileResponse {
  return {
    tradeName: row.tradeName,
    phone: row.contactPhone,
    email: row.contactEmail,
    website: row.website,
    postalAddress: row.postalAddress,
    licenceNumbers: row.licenceNumbers,
    timeZone: row.timeZone,
    locale: row.locale,
    logo: row.logoKey ? { url: `/api/company/profile/logo?v=${logoVersion(row.logoKey)}` } : null,
    updatedAt: row.updatedAt.toISOString(),
  };
}

function toDepthRulesResponse(row: CompanyProfileRow): CompanyDepthRulesResponse {
  return { table: row.depthRules ?? DEFAULT_DEPTH_RULES, isDefault: row.depthRules === null, defaults: DEFAULT_DEPTH_RULES };
}

/** The company's depth rule table: its own when edited, else the shipped defaults. */
export function companyDepthRules(row: Pick<CompanyProfileRow, 'depthRules'>): DepthRuleTable {
  return row.depthRules ?? DEFAULT_DEPTH_RULES;
}

/**
 * The company profile the admin fills in (office may read it): trade name, contact, licences, time
 * zone, locale, logo and depth rules. Every change is one transaction with its audit entry. The logo is
 * stored as a normalised PNG under a key made from its SHA-256 and is never overwritten or deleted, so
 * packet revisions that copied the key at issue time keep printing the logo they were issued with.
 */
@Injectable()
export class CompanyProfileService {
  private readonly logger = new Logger(CompanyProfileService.name);

  constructor(
    private readonly repository: CompanyProfileRepository,
    private readonly processor: LogoProcessor,
    private readonly audit: AuditService,
    @Inject(OBJECT_STORAGE) private readonly storage: ObjectStorage,
  ) {}

  async profile(actor: AuthUser): Promise<CompanyProfileResponse> {
    return toProfileResponse(await this.repository.profile(actor.companyId));
  }

  async update(actor: AuthUser, input: UpdateCompanyProfileInput): Promise<CompanyProfileResponse> {
    const patch: CompanyProfilePatch = {
      ...(input.tradeName !== undefined ? { tradeName: input.tradeName } : {}),
      ...(input.phone !== undefined ? { contactPhone: input.phone } : {}),
      ...(input.email !== undefined ? { contactEmail: input.email } : {}),
      ...(input.website !== undefined ? { website: input.website } : {}),
      ...(input.postalAddress !== undefined ? { postalAddress: input.postalAddress } : {}),
      ...(input.licenceNumbers !== undefined ? { licenceNumbers: input.licenceNumbers } : {}),
      ...(input.timeZone !== undefined ? { timeZone: input.timeZone } : {}),
      ...(input.locale !== undefined ? { locale: input.locale } : {}),
    };
    return this.write(actor, 'company.profile.update', patch, { fields: Object.keys(input) }).then(toProfileResponse);
  }

  async uploadLogo(actor: AuthUser, file: UploadedLogoFile | undefined): Promise<CompanyProfileResponse> {
    if (!file || file.size === 0) {
      const message = 'attach the logo image in the multipart field "file"';
      throw new ValidationError([{ path: 'file', message }]);
    }
    const logo = await this.processor.process(file.buffer);
    const key = `${LOGO_PREFIX(actor.companyId)}${createHash('sha256').update(logo.body).digest('hex')}.png`;
    // The same picture uploaded again has the same key: then it is already stored and must stay.
    const isNew = !(await this.storage.exists(key));
    if (isNew) await this.storage.put(key, logo.body, 'image/png');
    try {
      const row = await this.write(actor, 'company.logo.update', { logoKey: key }, { width: logo.width, height: logo.height, bytes: logo.body.length });
      return toProfileResponse(row);
    } catch (error) {
      if (isNew) await this.storage.delete(key).catch((e: unknown) => this.logger.warn(`could not delete the unrecorded logo ${key}: ${String(e)}`));
      throw error;
    }
  }

  /** Removes the logo from the profile; the stored picture stays for the revisions that printed it. */
  async removeLogo(actor: AuthUser): Promise<CompanyProfileResponse> {
    const current = await this.repository.profile(actor.companyId);
    if (!current.logoKey) throw new NotFoundError('LOGO_NOT_FOUND', 'The company has no logo.');
    return toProfileResponse(await this.write(actor, 'company.logo.remove', { logoKey: null }, {}));
  }

  async logo(actor: AuthUser): Promise<LogoContent> {
    const { logoKey } = await this.repository.profile(actor.companyId);
    if (!logoKey) throw new NotFoundError('LOGO_NOT_FOUND', 'The company has no logo.');
    return { body: await this.storage.getBuffer(logoKey), etag: `"${logoVersion(logoKey)}"` };
  }

  async depthRules(actor: AuthUser): Promise<CompanyDepthRulesResponse> {
    return toDepthRulesResponse(await this.repository.profile(actor.companyId));
  }

  async updateDepthRules(actor: AuthUser, input: UpdateDepthRulesInput): Promise<CompanyDepthRulesResponse> {
    return toDepthRulesResponse(await this.write(actor, 'company.depth_rules.update', { depthRules: input }, { ruleCount: input.rules.length }));
  }

  async resetDepthRules(actor: AuthUser): Promise<CompanyDepthRulesResponse> {
    return toDepthRulesResponse(await this.write(actor, 'company.depth_rules.reset', { depthRules: null }, {}));
  }

  private write(actor: AuthUser, action: string, patch: CompanyProfilePatch, details: Record<string, unknown>): Promise<CompanyProfileRow> {
    return this.repository.transaction(async (tx) => {
      await this.repository.lock(actor.companyId, tx);
      const row = await this.repository.update(actor.companyId, patch, tx);
      await this.audit.record({ companyId: actor.companyId, actorUserId: actor.id, action, targetType: 'company', targetId: actor.companyId, details }, tx);
      return row;
    });
  }
}
