import { createHash } from 'node:crypto';

import { HttpException, HttpStatus, Inject, Injectable, Logger } from '@nestjs/common';

import { hashToken } from '../auth/tokens.js';
import type { LocateLink } from '../db/schema/index.js';
import { NotFoundError } from '../domain/errors.js';
import { LOCATE_LINK_NOT_VALID, type LocateViewResponse } from '../domain/locate/locate-link.schema.js';
import { locateCautions } from '../domain/locate/locate-cautions.js';
import { buildSiteMap, type SiteMapSource } from '../domain/locate/site-map.js';
import type { SiteMap, SiteMapGeoJson } from '../domain/locate/site-map.schema.js';
import { TOLERANCE_ZONE_M } from '../domain/packet/packet-cautions.js';
import { drawDepthProfile } from '../drawings/depth-profile.js';
import { createNodeSvgCanvas } from '../drawings/node-svg-window.js';
import { PdfRendererService } from '../packets/pdf-renderer.service.js';
import { photoNotFound } from '../photos/photo-errors.js';
import { OBJECT_STORAGE, type ObjectStorage } from '../storage/object-storage.js';
import { renderLocateSheetHtml } from './locate-sheet.js';
import { LocateMissLimiter } from './locate-miss-limiter.js';
import { LocateRepository } from './locate.repository.js';

export interface LocateClient {
  ip: string | null;
  userAgent: string | null;
}

/** Tokens we hand out are 43 base64url characters; anything unlike a token is a miss without a query. */
const TOKEN_SHAPE = /^[A-Za-z0-9_-]{20,100}$/;

/** Printed locate sheets kept in memory under the hash of their HTML (same page in, same PDF out). */
const SHEET_CACHE_SIZE = 32;

const notValid = () => new NotFoundError(LOCATE_LINK_NOT_VALID, 'This locate link is not valid.');

/**
 * The public, read-only locate view behind a link's token: the site's cumulative map from the issued
 * revisions' snapshots, the installer's contact, the cautions, depth profiles and trench photos
 * (metadata-stripped derivatives only). Unknown, expired and revoked tokens all answer the same 404;
 * an address with too many of those gets 429 for every locate request for a minute.
 */
@Injectable()
export class LocateService {
  private readonly logger = new Logger(LocateService.name);
  /** A public route that starts Chromium: a repeat of the same sheet is served from here, not printed again. */
  private readonly sheets = new Map<string, Buffer>();

  constructor(
    private readonly repository: LocateRepository,
    private readonly limiter: LocateMissLimiter,
    @Inject(OBJECT_STORAGE) private readonly storage: ObjectStorage,
    private readonly pdf: PdfRendererService,
  ) {}

  async view(token: string, client: LocateClient): Promise<LocateViewResponse> {
    return (await this.viewWithPaper(token, client)).view;
  }

  /**
   * The one-page printable locate sheet (PDF through the packet's sandboxed Chromium): the same data as
   * the view, so an expired or revoked link answers exactly as the view does.
   */
  async sheet(token: string, client: LocateClient): Promise<{ pdf: Buffer; fileName: string }> {
    const { view, paperSize } = await this.viewWithPaper(token, client);
    const html = renderLocateSheetHtml(view, paperSize);
    const key = createHash('sha256').update(html).digest('hex');
    let pdf = this.sheets.get(key);
    if (pdf) {
      this.sheets.delete(key);
    } else {
      pdf = await this.pdf.printPage(html);
      if (this.sheets.size >= SHEET_CACHE_SIZE) this.sheets.delete(this.sheets.keys().next().value!);
    }
    this.sheets.set(key, pdf);
    const slug = view.site.label.replace(/[^A-Za-z0-9]+/g, '-').replace(/^-|-$/g, '').toLowerCase() || 'site';
    return { pdf, fileName: `${slug}-locate-sheet.pdf` };
  }

  private async viewWithPaper(token: string, client: LocateClient): Promise<{ view: LocateViewResponse; paperSize: 'letter' | 'a4' }> {
    const link = await this.resolve(token, client);
    await this.repository.logAccess(link.id, client.ip, client.userAgent?.slice(0, 500) ?? null);
    const [site, installer, map] = await Promise.all([
      this.repository.siteInCompany(link.companyId, link.siteId),
      this.repository.installer(link.companyId),
      this.siteMap(link.siteId),
    ]);
    if (!site) throw notValid();
    const cautions = locateCautions(installer.units, installer.locale);
    const photos = await this.repository.runPhotos(link.siteId, map.runs.map((r) => r.id));
    const base = `/api/locate/${token}`;
    const view: LocateViewResponse = {
      site: {
        label: site.label,
        addressLine1: site.addressLine1,
        addressLine2: site.addressLine2,
        city: site.city,
        region: site.region,
        postalCode: site.postalCode,
        country: site.country,
        northAzimuthDeg: map.revisions.length > 0 ? map.frame.northAzimuthDeg : site.northAzimuthDeg,
      },
      installer: { companyName: installer.companyName, phone: installer.phone, email: installer.email, licenceNumbers: installer.licenceNumbers },
      locateSteps: cautions.locateSteps,
      cautions: cautions.cautions,
      cautionSummary: cautions.summary,
      toleranceZoneM: TOLERANCE_ZONE_M,
      units: installer.units,
      locale: installer.locale,
      timeZone: installer.timeZone,
      map,
      runs: map.runs.map((run) => ({
        id: run.id,
        label: run.label,
        cable: run.cableType,
        gauge: run.gauge,
        method: run.method,
        minDepthM: run.minDepthM,
        maxDepthM: run.maxDepthM,
        minCoverM: run.minCoverM,
        isShallow: run.isShallow,
        isSpare: run.isSpare,
        isAbandoned: run.isAbandoned,
        revision: run.revision,
        installedOn: run.installedOn ?? null,
        installedByJobTitle: run.installedByJobTitle ?? run.jobTitle,
        abandonedOn: run.abandonedOn ?? null,
        depthProfileUrl: `${base}/runs/${run.id}/depth-profile.svg`,
        photos: photos
          .filter((p) => p.runId === run.id)
          .map((p) => ({
            id: p.id,
            caption: p.caption,
            takenAt: p.exifTakenAt ? new Date(`${p.exifTakenAt}Z`).toISOString() : (p.clientTakenAt ?? p.createdAt).toISOString(),
            thumbUrl: `${base}/photos/${p.id}/thumb`,
            screenUrl: `${base}/photos/${p.id}/screen`,
          })),
      })),
      geojsonUrl: map.geojson ? `${base}/map.geojson` : null,
      sheetUrl: `${base}/sheet.pdf`,
      link: { expiresAt: link.expiresAt.toISOString(), note: link.note },
      generatedAt: new Date().toISOString(),
    };
    return { view, paperSize: installer.paperSize };
  }

  async geojson(token: string, client: LocateClient): Promise<{ geojson: SiteMapGeoJson; fileName: string }> {
    const link = await this.resolve(token, client);
    await this.repository.logAccess(link.id, client.ip, client.userAgent?.slice(0, 500) ?? null);
    const [map, site] = await Promise.all([this.siteMap(link.siteId), this.repository.siteInCompany(link.companyId, link.siteId)]);
    if (!map.geojson) {
      throw new NotFoundError('SITE_NOT_GEOREFERENCED', 'This site has no GPS origin, so its map has plan coordinates only.');
    }
    const slug = (site?.label ?? 'site').replace(/[^A-Za-z0-9]+/g, '-').replace(/^-|-$/g, '').toLowerCase() || 'site';
    return { geojson: map.geojson, fileName: `${slug}-buried-cables.geojson` };
  }

  async depthProfile(token: string, runId: string, client: LocateClient): Promise<string> {
    const link = await this.resolve(token, client);
    if (runId.length > 100) throw new NotFoundError('RUN_NOT_FOUND', 'No such run on this site.');
    const revisions = await this.repository.latestReadyRevisions(link.siteId);
    // The newest revision that has the run (a later job may have recorded it again).
    const source = revisions
      .filter((r) => r.snapshot.asBuilt?.runs.some((run) => run.id === runId))
      .sort((a, b) => b.issuedAt.getTime() - a.issuedAt.getTime())[0];
    if (!source) throw new NotFoundError('RUN_NOT_FOUND', 'No such run on this site.');
    const { snapshot } = source;
    return drawDepthProfile(snapshot.asBuilt, snapshot.analysis, runId, {
      createCanvas: createNodeSvgCanvas,
      units: snapshot.settings.units,
      widthIn: 5,
      heightIn: 2.2,
    });
  }

  async photo(token: string, photoId: string, variant: string, client: LocateClient): Promise<{ body: Buffer; contentType: string }> {
    const link = await this.resolve(token, client);
    // Only the resized, metadata-stripped derivatives; never the original (it may carry GPS).
    if (variant !== 'thumb' && variant !== 'screen') throw photoNotFound();
    const row = await this.repository.sitePhotoDerivative(link.siteId, photoId, variant);
    // Only trench photos (on a run or a depth reading), the ones the view lists.
    if (!row || (row.runId === null && row.depthReadingId === null)) throw photoNotFound();
    return { body: await this.storage.getBuffer(row.key), contentType: row.contentType };
  }

  /** The cumulative map of the site from the newest ready revision of each job (the portal uses it too). */
  async siteMap(siteId: string): Promise<SiteMap> {
    const revisions = await this.repository.latestReadyRevisions(siteId);
    const sources: SiteMapSource[] = revisions
      // A revision without a snapshot's as-built (never the case for an issued one) is skipped, not fatal.
      .filter((r) => r.snapshot.asBuilt !== undefined && r.snapshot.analysis !== undefined)
      .map((r) => ({
        revisionId: r.id,
        revision: r.revision,
        jobId: r.jobId,
        jobTitle: r.jobTitle,
        issuedAt: r.issuedAt.toISOString(),
        asBuilt: r.snapshot.asBuilt,
        analysis: r.snapshot.analysis,
        workDate: r.snapshot.job?.endDate ?? r.snapshot.job?.startDate ?? null,
        ...(r.snapshot.siteRecords ? { siteRecords: r.snapshot.siteRecords } : {}),
        ...(r.snapshot.removedRecords ? { removedIds: r.snapshot.removedRecords.map((x) => x.id) } : {}),
      }));
    return buildSiteMap(sources);
  }

  /** The link behind a token when it is usable; otherwise 404 (and a counted miss) or 429. */
  private async resolve(token: string, client: LocateClient): Promise<LocateLink> {
    const address = client.ip ?? 'unknown';
    if (this.limiter.isBlocked(address)) {
      throw new HttpException(
        { message: 'Too many invalid locate links from this address; wait a minute and try again.', code: 'TOO_MANY_LOCATE_ATTEMPTS' },
        HttpStatus.TOO_MANY_REQUESTS,
      );
    }
    const link = TOKEN_SHAPE.test(token) ? await this.repository.findActiveByHash(hashToken(token)) : undefined;
    if (!link) {
      this.limiter.recordMiss(address);
      this.logger.debug(`invalid locate token from ${address}`);
      throw notValid();
    }
    return link;
  }
}
