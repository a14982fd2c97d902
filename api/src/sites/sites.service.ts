import { BadRequestException, ConflictException, ForbiddenException, Injectable, NotFoundException } from '@nestjs/common';

import { AuditService } from '../audit/audit.service.js';
import type { AuthUser } from '../common/decorators/current-user.decorator.js';
import { isForeignKeyViolation } from '../common/db-errors.js';
import type { Tx } from '../db/db.module.js';
import type { NewSite, ReferencePointRow } from '../db/schema/index.js';
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

function invalidField(path: string, message: string): BadRequestException {
  return new BadRequestException({ message: `${path}: ${message}`, code: 'VALIDATION_FAILED', issues: [{ path, message }] });
}

const siteNotFound = () => new NotFoundException({ message: 'No such site.', code: 'SITE_NOT_FOUND' });

/** What a crew lead may change on a site: the plan's frame, which they set up on site. */
const LEAD_EDITABLE_SITE_FIELDS = new Set(['planCalibration', 'northAzimuthDeg']);

@Injectable()
export class SitesService {
  constructor(
    private readonly repository: SitesRepository,
    private readonly audit: AuditService,
  ) {}

  async list(actor: AuthUser, query: SiteListQuery): Promise<SiteSummaryResponse[]> {
    return (await this.repository.list(actor.companyId, query)).map(toSiteSummary);
  }

  async get(actor: AuthUser, id: string, tx?: Tx): Promise<SiteResponse> {
    const found = await this.repository.findInCompany(actor.companyId, id, tx);
    if (!found) throw siteNotFound();
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
      createdAt: site.createdAt.toISOString(),
      updatedAt: site.updatedAt.toISOString(),
    };
  }

  private async requireCustomer(actor: AuthUser, customerId: string, tx: Tx): Promise<void> {
    if (!(await this.repository.customerInCompany(actor.companyId, customerId, tx))) {
      throw new BadRequestException({
        message: 'customerId: no such customer in your company',
        code: 'VALIDATION_FAILED',
        issues: [{ path: 'customerId', message: 'no such customer in your company' }],
      });
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

  async update(actor: AuthUser, id: string, input: UpdateSiteInput): Promise<SiteResponse> {
    if (actor.role === 'lead') {
      // A crew lead on site sets the plan's frame (calibration, north); the rest is the office's.
      const refused = Object.keys(input).filter((key) => !LEAD_EDITABLE_SITE_FIELDS.has(key));
      if (refused.length > 0) {
        throw new ForbiddenException({
          message: `A crew lead may change only the plan calibration and north of a site, not ${refused.join(', ')}.`,
          code: 'FORBIDDEN_FIELDS',
          issues: refused.map((path) => ({ path, message: 'only the office may change this' })),
        });
      }
    }
    return this.repository.transaction(async (tx) => {
      if (input.customerId) await this.requireCustomer(actor, input.customerId, tx);
      if (input.planCalibration) await this.requireCalibrationFits(actor, id, input.planCalibration, tx);
      const site = await this.repository.updateInCompany(actor.companyId, id, toSiteColumns(input), tx);
      if (!site) throw siteNotFound();
      await this.record(actor, 'site.update', 'site', id, tx, { fields: Object.keys(input) });
      return this.get(actor, id, tx);
    });
  }

  /** 400 naming `planCalibration` without an uploaded image, or with a point outside the image. */
  private async requireCalibrationFits(actor: AuthUser, id: string, calibration: PlanCalibration, tx: Tx): Promise<void> {
    const site = await this.repository.lockInCompany(actor.companyId, id, tx);
    if (!site) throw siteNotFound();
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

  /** Refused (409) while the site has jobs: they are its history. */
  async remove(actor: AuthUser, id: string): Promise<void> {
    try {
      await this.repository.transaction(async (tx) => {
        if (!(await this.repository.deleteInCompany(actor.companyId, id, tx))) throw siteNotFound();
        await this.record(actor, 'site.delete', 'site', id, tx);
      });
    } catch (error) {
      if (isForeignKeyViolation(error)) {
        throw new ConflictException({ message: 'This site has jobs: it cannot be deleted.', code: 'SITE_HAS_JOBS' });
      }
      throw error;
    }
  }

  private async requireSite(actor: AuthUser, siteId: string, tx: Tx): Promise<void> {
    if (!(await this.repository.findInCompany(actor.companyId, siteId, tx))) throw siteNotFound();
  }

  async createReferencePoint(actor: AuthUser, siteId: string, input: CreateReferencePointInput): Promise<ReferencePointResponse> {
    return this.repository.transaction(async (tx) => {
      await this.requireSite(actor, siteId, tx);
      const row = await this.repository.insertReferencePoint(
        { siteId, label: input.label, x: input.x, y: input.y, notes: input.notes ?? null },
        tx,
      );
      await this.record(actor, 'site.reference_point.create', 'reference_point', row.id, tx, { siteId });
      return toReferencePoint(row);
    });
  }

  /**
   * Moving a reference point moves every item tied to it, on every job of the site: that is the point
   * of reference points (a corrected survey corrects all records).
   */
  async updateReferencePoint(actor: AuthUser, siteId: string, id: string, input: UpdateReferencePointInput): Promise<ReferencePointResponse> {
    return this.repository.transaction(async (tx) => {
      await this.requireSite(actor, siteId, tx);
      const row = await this.repository.updateReferencePoint(siteId, id, input, tx);
      if (!row) throw new NotFoundException({ message: 'No such reference point on this site.', code: 'REFERENCE_POINT_NOT_FOUND' });
      await this.record(actor, 'site.reference_point.update', 'reference_point', id, tx, { siteId, fields: Object.keys(input) });
      return toReferencePoint(row);
    });
  }

  /** Refused (409) while an item on any job is tied to the point. */
  async deleteReferencePoint(actor: AuthUser, siteId: string, id: string): Promise<void> {
    try {
      await this.repository.transaction(async (tx) => {
        await this.requireSite(actor, siteId, tx);
        if (!(await this.repository.deleteReferencePoint(siteId, id, tx))) {
          throw new NotFoundException({ message: 'No such reference point on this site.', code: 'REFERENCE_POINT_NOT_FOUND' });
        }
        await this.record(actor, 'site.reference_point.delete', 'reference_point', id, tx, { siteId });
      });
    } catch (error) {
      if (isForeignKeyViolation(error)) {
        throw new ConflictException({ message: 'Items are tied to this reference point: change their ties first.', code: 'IN_USE' });
      }
      throw error;
    }
  }

  async linkHomeowner(actor: AuthUser, siteId: string, userId: string): Promise<SiteResponse['homeowners']> {
    return this.repository.transaction(async (tx) => {
      await this.requireSite(actor, siteId, tx);
      if (!(await this.repository.homeownerInCompany(actor.companyId, userId, tx))) {
        throw new BadRequestException({
          message: 'userId: no such homeowner in your company',
          code: 'VALIDATION_FAILED',
          issues: [{ path: 'userId', message: 'no such homeowner in your company' }],
        });
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
        throw new NotFoundException({ message: 'This homeowner is not linked to the site.', code: 'HOMEOWNER_NOT_LINKED' });
      }
      await this.record(actor, 'site.homeowner.unlink', 'site', siteId, tx, { userId });
    });
  }
}
