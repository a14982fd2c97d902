import { Injectable } from '@nestjs/common';

import { AuditService } from '../audit/audit.service.js';
import type { AuthUser } from '../common/decorators/current-user.decorator.js';
import type { CompanySettingsRow, UserPreferencesRow } from '../db/schema/index.js';
import {
  type CompanySettingsResponse,
  effectiveUnits,
  type MyPreferencesResponse,
  type UpdateCompanySettingsInput,
  type UpdateMyPreferencesInput,
} from '../domain/settings/settings.schema.js';
import { SettingsRepository } from './settings.repository.js';

function toCompanySettings(row: CompanySettingsRow): CompanySettingsResponse {
  return { lengthUnits: row.units, gaugeUnits: row.gaugeUnits, paperSize: row.paperSize, updatedAt: row.updatedAt.toISOString() };
}

function toMyPreferences(own: UserPreferencesRow | undefined, company: CompanySettingsRow): MyPreferencesResponse {
  const mine = { lengthUnits: own?.lengthUnits ?? null, gaugeUnits: own?.gaugeUnits ?? null };
  const defaults = { lengthUnits: company.units, gaugeUnits: company.gaugeUnits };
  return { ...mine, company: { ...defaults, timeZone: company.timeZone, locale: company.locale }, effective: effectiveUnits(mine, defaults) };
}

@Injectable()
export class SettingsService {
  constructor(
    private readonly repository: SettingsRepository,
    private readonly audit: AuditService,
  ) {}

  async companySettings(actor: AuthUser): Promise<CompanySettingsResponse> {
    return toCompanySettings(await this.repository.companySettings(actor.companyId));
  }

  async updateCompanySettings(actor: AuthUser, input: UpdateCompanySettingsInput): Promise<CompanySettingsResponse> {
    return this.repository.transaction(async (tx) => {
      const row = await this.repository.updateCompanySettings(
        actor.companyId,
        {
          ...(input.lengthUnits ? { units: input.lengthUnits } : {}),
          ...(input.gaugeUnits ? { gaugeUnits: input.gaugeUnits } : {}),
          ...(input.paperSize ? { paperSize: input.paperSize } : {}),
        },
        tx,
      );
      await this.audit.record(
        { companyId: actor.companyId, actorUserId: actor.id, action: 'company.settings.update', targetType: 'company', targetId: actor.companyId, details: { ...input } },
        tx,
      );
      return toCompanySettings(row);
    });
  }

  async myPreferences(actor: AuthUser): Promise<MyPreferencesResponse> {
    const [own, company] = await Promise.all([this.repository.userPreferences(actor.id), this.repository.companySettings(actor.companyId)]);
    return toMyPreferences(own, company);
  }

  async updateMyPreferences(actor: AuthUser, input: UpdateMyPreferencesInput): Promise<MyPreferencesResponse> {
    return this.repository.transaction(async (tx) => {
      const own = await this.repository.upsertUserPreferences(actor.id, input, tx);
      await this.audit.record(
        { companyId: actor.companyId, actorUserId: actor.id, action: 'user.preferences.update', targetType: 'user', targetId: actor.id, details: { ...input } },
        tx,
      );
      return toMyPreferences(own, await this.repository.companySettings(actor.companyId, tx));
    });
  }
}
