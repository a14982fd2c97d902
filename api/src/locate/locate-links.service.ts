import { Injectable } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';

import { AuditService } from '../audit/audit.service.js';
import { hashToken, newOpaqueToken } from '../auth/tokens.js';
import type { AuthUser } from '../common/decorators/current-user.decorator.js';
import type { Env } from '../config/env.schema.js';
import type { Tx } from '../db/db.module.js';
import type { LocateLink } from '../db/schema/index.js';
import { NotFoundError } from '../domain/errors.js';
import type { CreatedLocateLinkResponse, CreateLocateLinkInput, LocateLinkResponse } from '../domain/locate/locate-link.schema.js';
import { LinkBuilder } from '../mail/link-builder.js';
import { siteNotFound } from '../sites/site-errors.js';
import { LocateRepository } from './locate.repository.js';

const DAY_MS = 86_400_000;

const linkNotFound = () => new NotFoundError('LOCATE_LINK_NOT_FOUND', 'No such locate link.');

function toResponse(link: LocateLink, extra: { createdByName: string | null; accessCount: number; lastAccessedAt: Date | null }): LocateLinkResponse {
  const now = Date.now();
  return {
    id: link.id,
    siteId: link.siteId,
    note: link.note,
    createdBy: link.createdByUserId ? { id: link.createdByUserId, name: extra.createdByName ?? '' } : null,
    createdAt: link.createdAt.toISOString(),
    expiresAt: link.expiresAt.toISOString(),
    revokedAt: link.revokedAt?.toISOString() ?? null,
    isLongLived: link.isLongLived,
    isActive: link.revokedAt === null && link.expiresAt.getTime() > now,
    accessCount: extra.accessCount,
    lastAccessedAt: extra.lastAccessedAt?.toISOString() ?? null,
  };
}

/**
 * Locate links of a site: made, listed and revoked by the office (any site of the company) or by a
 * homeowner (their own sites only; another site answers 404, as if it did not exist). One
 * implementation serves both: the routes are the same, the access check differs by role.
 */
@Injectable()
export class LocateLinksService {
  constructor(
    private readonly repository: LocateRepository,
    private readonly audit: AuditService,
    private readonly links: LinkBuilder,
    private readonly config: ConfigService<Env, true>,
  ) {}

  async create(actor: AuthUser, siteId: string, input: CreateLocateLinkInput): Promise<CreatedLocateLinkResponse> {
    await this.requireSite(actor, siteId);
    const token = newOpaqueToken();
    const link = await this.repository.transaction(async (tx) => {
      const row = await this.repository.insertLink(
        {
          companyId: actor.companyId,
          siteId,
          createdByUserId: actor.id,
          tokenHash: hashToken(token),
          note: input.note || null,
          expiresAt: new Date(Date.now() + input.expiresInDays * DAY_MS),
          isLongLived: false,
        },
        tx,
      );
      await this.audit.record(
        {
          companyId: actor.companyId,
          actorUserId: actor.id,
          action: 'locate_link.create',
          targetType: 'locate_link',
          targetId: row.id,
          details: { siteId, expiresInDays: input.expiresInDays },
        },
        tx,
      );
      return row;
    });
    return {
      ...toResponse(link, { createdByName: actor.name, accessCount: 0, lastAccessedAt: null }),
      url: this.urlFor(token),
      token,
    };
  }

  async list(actor: AuthUser, siteId: string): Promise<LocateLinkResponse[]> {
    await this.requireSite(actor, siteId);
    return (await this.repository.listBySite(siteId)).map((row) => toResponse(row.link, row));
  }

  async revoke(actor: AuthUser, id: string): Promise<void> {
    const link = await this.repository.findLink(id);
    if (!link || link.companyId !== actor.companyId) throw linkNotFound();
    await this.requireSite(actor, link.siteId).catch(() => {
      throw linkNotFound();
    });
    await this.repository.transaction(async (tx) => {
      await this.repository.revoke(id, tx);
      await this.audit.record(
        { companyId: actor.companyId, actorUserId: actor.id, action: 'locate_link.revoke', targetType: 'locate_link', targetId: id, details: { siteId: link.siteId } },
        tx,
      );
    });
  }

  /**
   * At issue: the locate URL the revision's QR code prints. Reuses (and renews) the site's active
   * long-lived link when a revision already prints it (its token is known only there); otherwise makes a
   * new one.
   * Runs inside the issue transaction, so a revision never exists without its locate URL.
   */
  async urlForIssuedRevision(actor: AuthUser, siteId: string, revisionId: string, tx: Tx): Promise<string> {
    const existing = await this.repository.activeLongLivedUrl(siteId, tx);
    const days = this.config.get('LOCATE_LONG_LIVED_DAYS', { infer: true });
    if (existing) {
      // One link per site for every packet's QR code: each issue renews it for the full term from now
      // (never shortens it), so the newest packet's code works as long as a first packet's would.
      await this.repository.renewLink(existing.linkId, new Date(Date.now() + days * DAY_MS), tx);
      await this.repository.attachToRevision(revisionId, existing.linkId, existing.url, tx);
      return existing.url;
    }
    const token = newOpaqueToken();
    const link = await this.repository.insertLink(
      {
        companyId: actor.companyId,
        siteId,
        createdByUserId: actor.id,
        tokenHash: hashToken(token),
        note: 'Printed as the QR code of the handover packet',
        expiresAt: new Date(Date.now() + days * DAY_MS),
        isLongLived: true,
      },
      tx,
    );
    const url = this.urlFor(token);
    await this.repository.attachToRevision(revisionId, link.id, url, tx);
    return url;
  }

  urlFor(token: string): string {
    return this.links.to(`/locate/${token}`);
  }

  /** Staff see any site of their company; a homeowner only the sites linked to them. */
  private async requireSite(actor: AuthUser, siteId: string): Promise<void> {
    const site =
      actor.role === 'homeowner'
        ? await this.repository.siteOfHomeowner(actor.id, siteId)
        : await this.repository.siteInCompany(actor.companyId, siteId);
    if (!site || site.companyId !== actor.companyId) throw siteNotFound();
  }
}
