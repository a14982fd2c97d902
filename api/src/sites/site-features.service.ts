import { Injectable } from '@nestjs/common';

import type { AuthUser } from '../common/decorators/current-user.decorator.js';
import type { SiteFeatureRow } from '../db/schema/index.js';
import {
  type CreateSiteFeatureInput,
  featurePointsIssue,
  SITE_FEATURE_LIMITS,
  type SiteFeatureKind,
  type SiteFeatureResponse,
  type SiteFeatureShape,
  type UpdateSiteFeatureInput,
} from '../domain/sites/site-feature.schema.js';
import { ConflictError, findOrFail, NotFoundError, ValidationError } from '../domain/errors.js';
import type { SiteVersionResponse } from '../domain/sites/site-rules.js';
import { siteNotFound } from './site-errors.js';
import { SiteFeaturesRepository } from './site-features.repository.js';
import { SiteWriter } from './site-writer.js';

const featureNotFound = () => new NotFoundError('SITE_FEATURE_NOT_FOUND', 'No such feature on this site.');

export function toSiteFeature(row: SiteFeatureRow): SiteFeatureResponse {
  return {
    id: row.id,
    kind: row.kind as SiteFeatureKind,
    name: row.name,
    shape: row.shape as SiteFeatureShape,
    points: row.points.map((p) => ({ x: p.x, y: p.y })),
    createdAt: row.createdAt.toISOString(),
    updatedAt: row.updatedAt.toISOString(),
  };
}

/**
 * Landmarks on a site's plan. Staff read them; writes go through `SiteWriter` as a geometry change of
 * the site (If-Match with the site version; crew leads only on an open job's crew; refused while a job
 * on the site is under review), because every job's drawings show them.
 */
@Injectable()
export class SiteFeaturesService {
  constructor(
    private readonly repository: SiteFeaturesRepository,
    private readonly writer: SiteWriter,
  ) {}

  async list(actor: AuthUser, siteId: string): Promise<SiteFeatureResponse[]> {
    if (!(await this.repository.siteExists(actor.companyId, siteId))) throw siteNotFound();
    return (await this.repository.list(siteId)).map(toSiteFeature);
  }

  async create(actor: AuthUser, siteId: string, expectedVersion: number, input: CreateSiteFeatureInput): Promise<SiteFeatureResponse & SiteVersionResponse> {
    return this.writer.write(actor, siteId, expectedVersion, 'geometry', async ({ tx }) => {
      if ((await this.repository.countOnSite(siteId, tx)) >= SITE_FEATURE_LIMITS.maxFeaturesPerSite) {
        throw new ConflictError('TOO_MANY_FEATURES', `A site holds at most ${SITE_FEATURE_LIMITS.maxFeaturesPerSite} features.`);
      }
      const row = await this.repository.insert({ siteId, kind: input.kind, name: input.name, shape: input.shape, points: input.points }, tx);
      return { result: toSiteFeature(row), audit: { action: 'site.feature.create', targetType: 'site_feature', targetId: row.id, details: { kind: row.kind } } };
    });
  }

  async update(
    actor: AuthUser,
    siteId: string,
    id: string,
    expectedVersion: number,
    input: UpdateSiteFeatureInput,
  ): Promise<SiteFeatureResponse & SiteVersionResponse> {
    return this.writer.write(actor, siteId, expectedVersion, 'geometry', async ({ tx }) => {
      const current = await findOrFail(this.repository.find(siteId, id, tx), featureNotFound);
      const shape = input.shape ?? (current.shape as SiteFeatureShape);
      const points = input.points ?? current.points;
      const issue = featurePointsIssue(shape, points);
      if (issue !== null) {
        const path = input.points !== undefined ? 'points' : 'shape';
        throw new ValidationError([{ path, message: issue }]);
      }
      const row = await this.repository.update(siteId, id, { kind: input.kind, name: input.name, shape: input.shape, points: input.points }, tx);
      return { result: toSiteFeature(row!), audit: { action: 'site.feature.update', targetType: 'site_feature', targetId: id } };
    });
  }

  async remove(actor: AuthUser, siteId: string, id: string, expectedVersion: number): Promise<SiteVersionResponse> {
    return this.writer.write(actor, siteId, expectedVersion, 'geometry', async ({ tx }) => {
      if (!(await this.repository.delete(siteId, id, tx))) throw featureNotFound();
      return { result: {}, audit: { action: 'site.feature.delete', targetType: 'site_feature', targetId: id } };
    });
  }
}
