import { Injectable } from '@nestjs/common';

import { AuditService } from '../audit/audit.service.js';
import type { AuthUser } from '../common/decorators/current-user.decorator.js';
import { isForeignKeyViolation } from '../common/db-errors.js';
import type { Tx } from '../db/db.module.js';
import type { NewSite, ReferencePointRow, Site } from '../db/schema/index.js';
import { ConflictError, findOrFail, ForbiddenError, NotFoundError, ValidationError } from '../domain/errors.js';
import { type CursorPage, cursorPageOf } from '../domain/paging/page.schema.js';
import type { SiteVersionResponse, SiteWriteKind } from '../domain/sites/site-rules.js';
import type {
  CreateReferencePointInput,
  CreateSiteInput,
  PlanCalibration,
  ReferencePointResponse,
  SiteListQuery,
  SiteResponse,
  SiteSummaryResponse,
  UpdateReferencePointInput,
  UpdateSiteInput,
} from '../domain/sites/site.schema.js';
import { planCalibrationOf, toPlanImageResponse } from './plan-image-ref.js';
import { siteNotFound } from './site-errors.js';
import { SiteWriter } from './site-writer.js';
import { type SiteWithCustomer, SitesRepository } from './sites.repository.js';

function toSiteSummary({ site, customer }: SiteWithCustomer): SiteSummaryResponse {
  return {
    id: site.id,
    label: site.label,
    customer,
    addressLine1: site.addressLine1,
    addressLine2: site.addressLine2,
    city: site.city,
    region: site.region,
    postalCode: site.postalCode,
    country: site.country,
  };
}

function toReferencePoint(row: ReferencePointRow): ReferencePointResponse {
  return { id: row.id, label: row.label, x: row.x, y: row.y, notes: row.notes };
}

/** Site columns from a create or update body (only the fields it names). */
function toSiteColumns(input: UpdateSiteInput): Partial<NewSite> {
  const { origin, planCalibration, ...rest } = input;
  return {
    ...rest,
    ...(origin === undefined ? {} : { originLat: origin?.lat ?? null, originLon: origin?.lon ?? null }),
    ...(planCalibration === undefined
      ? {}
      : {
          planCalAx: planCalibration?.a.x ?? null,
          planCalAy: planCalibration?.a.y ?? null,
          planCalBx: planCalibration?.b.x ?? null,
          planCalBy: planCalibration?.b.y ?? null,
          planCalDistanceM: planCalibration?.distanceM ?? null,
        }),
  };
}

function invalidField(path: string, message: string): ValidationError {
  return new ValidationError([{ path, message }]);
}

/** 400 naming `planCalibration` without an uploaded image, or with a point outside the image. */
function requireCalibrationFits(site: Site, calibration: PlanCalibration): void {
  if (site.planImageWidthPx === null || site.planImageHeightPx === null) {
    throw invalidField('planCalibration', 'the site has no plan image: upload one (PUT /api/sites/:id/plan-image), then calibrate it');
  }
  for (const key of ['a', 'b'] as const) {
    const p = calibration[key];
    if (p.x > site.planImageWidthPx || p.y > site.planImageHeightPx) {
      throw invalidField(`planCalibration.${key}`, `lies outside the ${site.planImageWidthPx}×${site.planImageHeightPx} px plan image`);
    }
  }
}

/** What a crew lead may change on a site: the plan's frame, which they set up on site. */
const LEAD_EDITABLE_SITE_FIELDS = new Set(['planCalibration', 'northAzimuthDeg']);

/** Fields of a site that place the jobs' records on the plan: changing one is a geometry write. */
const GEOMETRY_SITE_FIELDS = new Set(['planCalibration', 'northAzimuthDeg', 'origin']);

/** A site PATCH touching any field that places the jobs' records is a geometry write. */
export function siteWriteKindOf(input: UpdateSiteInput): SiteWriteKind {
  return Object.keys(input).some((key) => GEOMETRY_SITE_FIELDS.has(key)) ? 'geometry' : 'details';
}

const referencePointNotFound = () =>
  new NotFoundError('REFERENCE_POINT_NOT_FOUND', 'No such reference point on this site.');

@Injectable()
export class SitesService {
  constructor(
    private readonly repository: SitesRepository,
    private readonly audit: AuditService,
    private readonly writer: SiteWriter,
  ) {}

  async list(actor: AuthUser, query: SiteListQuery): Promise<CursorPage<SiteSummaryResponse>> {
    const { rows, total } = await this.repository.list(actor.companyId, query);
    return cursorPageOf(
      rows.map((row) => ({ ...row, id: row.site.id })),
      total,
      query,
      (row) => row.site.label,
      toSiteSummary,
    );
  }

  async get(actor: AuthUser, id: string, tx?: Tx): Promise<SiteResponse> {
    const found = await findOrFail(this.repository.findInCompany(actor.companyId, id, tx), siteNotFound);
    const { site } = found;
    const [points, homeowners, jobs] = [
      await this.repository.referencePoints(id, tx),
      await this.repository.homeowners(id, tx),
      await this.repository.jobs(id, tx),
    ];
    return {
      ...toSiteSummary(found),
      northAzimuthDeg: site.northAzimuthDeg,
      origin: site.originLat !== null && site.originLon !== null ? { lat: site.originLat, lon: site.originLon } : null,
      planImage: toPlanImageResponse(site),
      planCalibration: planCalibrationOf(site),
      notes: site.notes,
      referencePoints: points.map(toReferencePoint),
      homeowners,
      jobs: jobs.map((j) => ({ ...j, updatedAt: j.updatedAt.toISOString() })),
      version: site.version,
      createdAt: site.createdAt.toISOString(),
      updatedAt: site.updatedAt.toISOString(),
    };
  }

  private async requireCustomer(actor: AuthUser, customerId: string, tx: Tx): Promise<void> {
    if (!(await this.repository.customerInCompany(actor.companyId, customerId, tx))) {
      throw invalidField('customerId', 'no such customer in your company');
    }
  }

  private record(actor: AuthUser, action: string, targetType: string, targetId: string, tx: Tx, details?: Record<string, unknown>) {
    return this.audit.record({ companyId: actor.companyId, actorUserId: actor.id, action, targetType, targetId, details }, tx);
  }

  async create(actor: AuthUser, input: CreateSiteInput): Promise<SiteResponse> {
    return this.repository.transaction(async (tx) => {
      await this.requireCustomer(actor, input.customerId, tx);
      const site = await this.repository.insert(
        { ...toSiteColumns(input), companyId: actor.companyId } as NewSite,
        tx,
      );
      await this.record(actor, 'site.create', 'site', site.id, tx);
      return this.get(actor, site.id, tx);
    });
  }

  /**
   * Changes a site on top of `expectedVersion` (SiteWriter): name, address and notes are the office's;
   * north, origin and plan calibration are geometry (see `canWriteSite`), and bump every open job.
   */
  async update(actor: AuthUser, id: string, expectedVersion: number, input: UpdateSiteInput): Promise<SiteResponse & SiteVersionResponse> {
    if (actor.role === 'lead') {
      // A crew lead on site sets the plan's frame (calibration, north); the rest is the office's.
      const refused = Object.keys(input).filter((key) => !LEAD_EDITABLE_SITE_FIELDS.has(key));
      if (refused.length > 0) {
        throw new ForbiddenError(
          'FORBIDDEN_FIELDS',
          `A crew lead may change only the plan calibration and north of a site, not ${refused.join(', ')}.`,
          refused.map((path) => ({ path, message: 'only the office may change this' })),
        );
      }
    }
    return this.writer.write(actor, id, expectedVersion, siteWriteKindOf(input), async ({ tx, site }) => {
      if (input.customerId) await this.requireCustomer(actor, input.customerId, tx);
      if (input.planCalibration) requireCalibrationFits(site, input.planCalibration);
      await this.repository.updateInCompany(actor.companyId, id, toSiteColumns(input), tx);
      return {
        readAfter: () => this.get(actor, id, tx),
        audit: { action: 'site.update', targetType: 'site', targetId: id, details: { fields: Object.keys(input) } },
      };
    });
  }

  /** Refused (409) while the site has jobs: they are its history. */
  async remove(actor: AuthUser, id: string): Promise<void> {
    try {
      await this.repository.transaction(async (tx) => {
        if (!(await this.repository.deleteInCompany(actor.companyId, id, tx))) throw siteNotFound();
        await this.record(actor, 'site.delete', 'site', id, tx);
      });
    } catch (error) {
      if (isForeignKeyViolation(error)) {
        throw new ConflictError('SITE_HAS_JOBS', 'This site has jobs: it cannot be deleted.');
      }
      throw error;
    }
  }

  private async requireSite(actor: AuthUser, siteId: string, tx: Tx): Promise<void> {
    if (!(await this.repository.findInCompany(actor.companyId, siteId, tx))) throw siteNotFound();
  }

  async createReferencePoint(
    actor: AuthUser,
    siteId: string,
    expectedVersion: number,
    input: CreateReferencePointInput,
  ): Promise<ReferencePointResponse & SiteVersionResponse> {
    return this.writer.write(actor, siteId, expectedVersion, 'geometry', async ({ tx }) => {
      const row = await this.repository.insertReferencePoint(
        { siteId, label: input.label, x: input.x, y: input.y, notes: input.notes ?? null },
        tx,
      );
      return {
        result: toReferencePoint(row),
        audit: { action: 'site.reference_point.create', targetType: 'reference_point', targetId: row.id },
      };
    });
  }

  /**
   * Moving a reference point moves every item tied to it, on every job of the site: that is the point
   * of reference points (a corrected survey corrects all records).
   */
  async updateReferencePoint(
    actor: AuthUser,
    siteId: string,
    id: string,
    expectedVersion: number,
    input: UpdateReferencePointInput,
  ): Promise<ReferencePointResponse & SiteVersionResponse> {
    return this.writer.write(actor, siteId, expectedVersion, 'geometry', async ({ tx }) => {
      const row = await findOrFail(this.repository.updateReferencePoint(siteId, id, input, tx), referencePointNotFound);
      return {
        result: toReferencePoint(row),
        audit: { action: 'site.reference_point.update', targetType: 'reference_point', targetId: id, details: { fields: Object.keys(input) } },
      };
    });
  }

  /** Refused (409) while an item on any job is tied to the point. */
  async deleteReferencePoint(actor: AuthUser, siteId: string, id: string, expectedVersion: number): Promise<SiteVersionResponse> {
    try {
      return await this.writer.write(actor, siteId, expectedVersion, 'geometry', async ({ tx }) => {
        if (!(await this.repository.deleteReferencePoint(siteId, id, tx))) throw referencePointNotFound();
        return { result: {}, audit: { action: 'site.reference_point.delete', targetType: 'reference_point', targetId: id } };
      });
    } catch (error) {
      if (isForeignKeyViolation(error)) {
        throw new ConflictError('IN_USE', 'Items are tied to this reference point: change their ties first.');
      }
      throw error;
    }
  }

  async linkHomeowner(actor: AuthUser, siteId: string, userId: string): Promise<SiteResponse['homeowners']> {
    return this.repository.transaction(async (tx) => {
      await this.requireSite(actor, siteId, tx);
      if (!(await this.repository.homeownerInCompany(actor.companyId, userId, tx))) {
        throw invalidField('userId', 'no such homeowner in your company');
      }
      await this.repository.linkHomeowner(siteId, userId, tx);
      await this.record(actor, 'site.homeowner.link', 'site', siteId, tx, { userId });
      return this.repository.homeowners(siteId, tx);
    });
  }

  async unlinkHomeowner(actor: AuthUser, siteId: string, userId: string): Promise<void> {
    await this.repository.transaction(async (tx) => {
      await this.requireSite(actor, siteId, tx);
      if (!(await this.repository.unlinkHomeowner(siteId, userId, tx))) {
        throw new NotFoundError('HOMEOWNER_NOT_LINKED', 'This homeowner is not linked to the site.');
      }
      await this.record(actor, 'site.homeowner.unlink', 'site', siteId, tx, { userId });
    });
  }
}
