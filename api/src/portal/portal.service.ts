import { Injectable, NotFoundException } from '@nestjs/common';

import type { AuthUser } from '../common/decorators/current-user.decorator.js';
import type { PortalPacket, PortalSiteDetailResponse, PortalSiteResponse } from '../domain/delivery/portal.schema.js';
import type { SiteMap } from '../domain/locate/site-map.schema.js';
import { LocateService } from '../locate/locate.service.js';
import { type PacketFile, PacketsService } from '../packets/packets.service.js';
import { PortalRepository } from './portal.repository.js';

const siteNotFound = () => new NotFoundException({ message: 'No such site.', code: 'SITE_NOT_FOUND' });
const packetNotFound = () => new NotFoundException({ message: 'No such packet revision.', code: 'PACKET_NOT_FOUND' });

type SiteRow = NonNullable<Awaited<ReturnType<PortalRepository['siteOf']>>>;
type RevisionRow = Awaited<ReturnType<PortalRepository['readyRevisions']>>[number];

function toSiteResponse(row: SiteRow, revisions: readonly RevisionRow[]): PortalSiteResponse {
  const own = revisions.filter((r) => r.siteId === row.site.id);
  return {
    id: row.site.id,
    label: row.site.label,
    addressLine1: row.site.addressLine1,
    addressLine2: row.site.addressLine2,
    city: row.site.city,
    region: row.site.region,
    postalCode: row.site.postalCode,
    country: row.site.country,
    installer: { companyName: row.companyName, phone: row.phone ?? null, email: row.email ?? null, licenceNumbers: row.licenceNumbers ?? [] },
    packetCount: own.length,
    lastIssuedAt: own[0]?.issuedAt.toISOString() ?? null,
  };
}

/**
 * The homeowner's portal: their sites (linked through site_homeowners), every ready revision there,
 * the verified files, and the cumulative site map. Any other site or revision answers 404.
 */
@Injectable()
export class PortalService {
  constructor(
    private readonly repository: PortalRepository,
    private readonly packets: PacketsService,
    private readonly locate: LocateService,
  ) {}

  async sites(actor: AuthUser): Promise<PortalSiteResponse[]> {
    const rows = await this.repository.sitesOf(actor.id);
    const revisions = await this.repository.readyRevisions(rows.map((r) => r.site.id));
    return rows.map((row) => toSiteResponse(row, revisions));
  }

  async site(actor: AuthUser, siteId: string): Promise<PortalSiteDetailResponse> {
    const row = await this.repository.siteOf(actor.id, siteId);
    if (!row) throw siteNotFound();
    // Newest first (issue time, then revision): the first is the site's current record, whichever job
    // issued it; an older revision of a later job is not "latest" because its job came after.
    const revisions = await this.repository.readyRevisions([siteId]);
    const latestId = revisions[0]?.id;
    const packets: PortalPacket[] = revisions.map((r) => ({
      id: r.id,
      jobId: r.jobId,
      jobTitle: r.jobTitle,
      revision: r.revision,
      issuedAt: r.issuedAt.toISOString(),
      pageCount: r.pageCount,
      pdf: { bytes: r.pdfBytes ?? 0, sha256: r.pdfSha256 ?? '', url: `/api/portal/packets/${r.id}/pdf` },
      archive: { bytes: r.zipBytes ?? 0, sha256: r.zipSha256 ?? '', url: `/api/portal/packets/${r.id}/archive.zip` },
      isLatest: r.id === latestId,
    }));
    return {
      ...toSiteResponse(row, revisions),
      packets,
      mapUrl: `/api/portal/sites/${siteId}/map`,
      locateLinksUrl: `/api/sites/${siteId}/locate-links`,
    };
  }

  async map(actor: AuthUser, siteId: string): Promise<SiteMap> {
    if (!(await this.repository.siteOf(actor.id, siteId))) throw siteNotFound();
    return this.locate.siteMap(siteId);
  }

  /** The same verified download as the staff routes, once the revision's site is the homeowner's. */
  async file(actor: AuthUser, revisionId: string, kind: 'pdf' | 'zip'): Promise<PacketFile> {
    const row = await this.repository.revisionOf(actor.id, revisionId);
    if (!row || row.companyId !== actor.companyId) throw packetNotFound();
    return this.packets.fileInCompany(row.companyId, revisionId, kind);
  }
}
