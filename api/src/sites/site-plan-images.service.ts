import { randomUUID } from 'node:crypto';

import { Inject, Injectable, Logger } from '@nestjs/common';

import type { AuthUser } from '../common/decorators/current-user.decorator.js';
import type { Site } from '../db/schema/index.js';
import { NotFoundError, ValidationError } from '../domain/errors.js';
import type { PlanImageUploadResponse, SiteResponse } from '../domain/sites/site.schema.js';
import type { SiteVersionResponse } from '../domain/sites/site-rules.js';
import type { PlanImage } from '../drawings/drawing-options.js';
import { planImageForDrawing } from '../drawings/job-drawings.js';
import { OBJECT_STORAGE, ObjectNotFoundError, type ObjectStorage } from '../storage/object-storage.js';
import { PlanImageProcessor } from './plan-image-processor.js';
import { siteNotFound } from './site-errors.js';
import { planCalibrationOf, planImageEtag } from './plan-image-ref.js';
import { SiteWriter } from './site-writer.js';
import { SitesRepository } from './sites.repository.js';
import { SitesService } from './sites.service.js';

/** The part of a Multer file the service uses (memory storage). */
export interface UploadedPlanFile {
  buffer: Buffer;
  size: number;
}

export interface PlanImageContent {
  body: Buffer;
  contentType: string;
  etag: string;
}

const noPlanImage = () => new NotFoundError('PLAN_IMAGE_NOT_FOUND', 'This site has no plan image.');

const CLEARED_PLAN_IMAGE = {
  planImageRef: null,
  planImageScreenRef: null,
  planImageWidthPx: null,
  planImageHeightPx: null,
  planImageContentType: null,
  planCalAx: null,
  planCalAy: null,
  planCalBx: null,
  planCalBy: null,
  planCalDistanceM: null,
} as const;

/**
 * The site-plan image: one per site, replaced as a whole. The slow part (decoding, resizing, storing)
 * runs before the site row is locked; if the database write then fails, the new objects are deleted
 * again. The old objects are deleted only after the new ones are recorded, so a failure never leaves
 * a site pointing at nothing.
 */
@Injectable()
export class SitePlanImagesService {
  private readonly logger = new Logger(SitePlanImagesService.name);

  constructor(
    private readonly repository: SitesRepository,
    private readonly sites: SitesService,
    private readonly processor: PlanImageProcessor,
    private readonly writer: SiteWriter,
    @Inject(OBJECT_STORAGE) private readonly storage: ObjectStorage,
  ) {}

  /**
   * The image is part of the site's geometry: the upload names the site version it replaces (If-Match)
   * and goes through SiteWriter (rights, jobs under review, version; bumps the site and its open jobs).
   */
  async upload(
    actor: AuthUser,
    siteId: string,
    expectedVersion: number,
    file: UploadedPlanFile | undefined,
  ): Promise<PlanImageUploadResponse & SiteVersionResponse> {
    if (!file || file.size === 0) {
      throw new ValidationError([{ path: 'file', message: 'attach the site-plan image in the multipart field "file"' }]);
    }
    // 404, 403, 409 (jobs under review, stale version) before spending CPU on the file; checked again below.
    await this.writer.precheck(actor, siteId, expectedVersion, 'geometry');
    const processed = await this.processor.process(file.buffer);

    const prefix = `companies/${actor.companyId}/sites/${siteId}/plan-image/${randomUUID()}`;
    const storedKeys: string[] = [];
    let previous: Site | undefined;
    try {
      const image = await this.storage.put(`${prefix}/plan.${processed.image.extension}`, processed.image.body, processed.image.contentType);
      storedKeys.push(image.key);
      const screen = await this.storage.put(`${prefix}/screen.${processed.screen.extension}`, processed.screen.body, processed.screen.contentType);
      storedKeys.push(screen.key);
      const result = await this.writer.write(actor, siteId, expectedVersion, 'geometry', async ({ tx, site }) => {
        previous = site;
        const wasCalibrationCleared = planCalibrationOf(previous) !== null;
        await this.repository.updateInCompany(
          actor.companyId,
          siteId,
          {
            ...CLEARED_PLAN_IMAGE,
            planImageRef: image.key,
            planImageScreenRef: screen.key,
            planImageWidthPx: processed.image.width,
            planImageHeightPx: processed.image.height,
            planImageContentType: processed.image.contentType,
          },
          tx,
        );
        return {
          readAfter: async () => ({ ...(await this.sites.get(actor, siteId, tx)), wasCalibrationCleared }),
          audit: {
            action: 'site.plan_image.upload',
            targetType: 'site',
            targetId: siteId,
            details: { widthPx: processed.image.width, heightPx: processed.image.height, bytes: image.bytes, wasCalibrationCleared },
          },
        };
      });
      await this.deleteQuietly([previous?.planImageRef, previous?.planImageScreenRef]);
      this.logger.log(`site ${siteId}: plan image stored (${processed.image.width}×${processed.image.height}) by user ${actor.id}`);
      return result;
    } catch (error) {
      await this.deleteQuietly(storedKeys);
      throw error;
    }
  }

  async remove(actor: AuthUser, siteId: string, expectedVersion: number): Promise<SiteResponse & SiteVersionResponse> {
    let previous: Site | undefined;
    const result = await this.writer.write(actor, siteId, expectedVersion, 'geometry', async ({ tx, site }) => {
      previous = site;
      if (previous.planImageRef === null) throw noPlanImage();
      await this.repository.updateInCompany(actor.companyId, siteId, CLEARED_PLAN_IMAGE, tx);
      return {
        readAfter: () => this.sites.get(actor, siteId, tx),
        audit: { action: 'site.plan_image.delete', targetType: 'site', targetId: siteId },
      };
    });
    await this.deleteQuietly([previous?.planImageRef, previous?.planImageScreenRef]);
    return result;
  }

  /** The stored image for staff of the company, or a homeowner linked to the site; 404 otherwise. */
  async open(actor: AuthUser, siteId: string): Promise<PlanImageContent> {
    const site =
      actor.role === 'homeowner'
        ? await this.repository.findLinkedToHomeowner(actor.id, siteId)
        : (await this.repository.findInCompany(actor.companyId, siteId))?.site;
    if (!site) throw siteNotFound();
    if (site.planImageRef === null || site.planImageContentType === null) throw noPlanImage();
    try {
      return { body: await this.storage.getBuffer(site.planImageRef), contentType: site.planImageContentType, etag: planImageEtag(site.planImageRef) };
    } catch (error) {
      if (error instanceof ObjectNotFoundError) throw noPlanImage();
      throw error;
    }
  }

  /**
   * The plan image a drawing of one of this company's sites puts underneath, as a data: URL of the
   * screen-size copy; undefined when the site has no image or no calibration (it cannot be placed).
   */
  async forDrawing(companyId: string, siteId: string): Promise<PlanImage | undefined> {
    const found = await this.repository.findInCompany(companyId, siteId);
    const site = found?.site;
    const calibration = site ? planCalibrationOf(site) : null;
    if (!site || calibration === null || site.planImageScreenRef === null || site.planImageWidthPx === null || site.planImageHeightPx === null) {
      return undefined;
    }
    let bytes: Buffer;
    try {
      bytes = await this.storage.getBuffer(site.planImageScreenRef);
    } catch (error) {
      if (!(error instanceof ObjectNotFoundError)) throw error;
      this.logger.warn(`site ${siteId}: plan image ${site.planImageScreenRef} is missing from storage; drawing without it`);
      return undefined;
    }
    return planImageForDrawing({
      href: `data:image/jpeg;base64,${bytes.toString('base64')}`,
      widthPx: site.planImageWidthPx,
      heightPx: site.planImageHeightPx,
      calibration,
    });
  }

  /** Deletes the stored objects, except those an issued packet still names (they stay frozen with it). */
  private async deleteQuietly(keys: readonly (string | null | undefined)[]): Promise<void> {
    const present = keys.filter((key): key is string => Boolean(key));
    let kept = new Set<string>();
    try {
      kept = await this.repository.planImageKeysInPackets(present);
    } catch (error) {
      this.logger.warn(`could not check packets for ${present.join(', ')}; keeping the files: ${(error as Error).message}`);
      return;
    }
    for (const key of present) {
      if (kept.has(key)) continue;
      try {
        await this.storage.delete(key);
      } catch (error) {
        this.logger.warn(`could not delete ${key}: ${(error as Error).message}`);
      }
    }
  }
}
