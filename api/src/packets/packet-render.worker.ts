import { readFile } from 'node:fs/promises';

import { Inject, Injectable, Logger } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';

import type { Env } from '../config/env.schema.js';
import type { PacketSignature, PacketSnapshot } from '../domain/packet/packet-snapshot.js';
import type { PlanImage } from '../drawings/drawing-options.js';
import { planImageForDrawing } from '../drawings/job-drawings.js';
import { QueueWorker } from '../common/queue-worker.js';
import { LinkBuilder } from '../mail/link-builder.js';
import { OBJECT_STORAGE, ObjectNotFoundError, type ObjectStorage } from '../storage/object-storage.js';
import { buildPacketArchive } from './packet-archive.js';
import { PACKET_PHOTO_SOURCE, type PacketPhotoSource } from './packet-photo-source.js';
import { PacketQueue } from './packet-queue.js';
import { PacketsRepository } from './packets.repository.js';
import { PdfRendererService } from './pdf-renderer.service.js';

const LOGO_TYPES: Record<string, string> = { png: 'image/png', jpg: 'image/jpeg', jpeg: 'image/jpeg', webp: 'image/webp' };

/**
 * Renders queued packet revisions: claims the revision (so no two workers render it), renders the PDF,
 * builds the archive, stores both, and only then marks the revision ready. A failed attempt goes back
 * to `queued` with its reason and pg-boss retries it with backoff; the last failure marks it `failed`.
 */
@Injectable()
export class PacketRenderWorker extends QueueWorker {
  protected readonly logger = new Logger(PacketRenderWorker.name);
  protected readonly workerName = 'packet render worker';

  constructor(
    private readonly repository: PacketsRepository,
    private readonly queue: PacketQueue,
    private readonly renderer: PdfRendererService,
    private readonly links: LinkBuilder,
    private readonly config: ConfigService<Env, true>,
    @Inject(OBJECT_STORAGE) private readonly storage: ObjectStorage,
    @Inject(PACKET_PHOTO_SOURCE) private readonly photos: PacketPhotoSource,
  ) {
    super();
  }

  /** Polls the queue in this process, and re-sends revisions whose message was lost. */
  protected async startWork(): Promise<void> {
    await this.queue.work(this.config.get('PACKET_RENDER_CONCURRENCY', { infer: true }), (job, meta) =>
      this.render(job.revisionId, meta.isFinalAttempt),
    );
    // A revision committed but never sent (the process stopped in between) is picked up here; a
    // duplicate message is harmless because rendering starts with an exclusive claim.
    for (const { id } of await this.repository.staleQueued(120)) await this.queue.enqueue({ revisionId: id });
  }

  async render(revisionId: string, isFinalAttempt: boolean): Promise<void> {
    // A revision left `rendering` this long by a worker that died may be claimed again; pg-boss
    // expires the dead attempt after the same time and retries it (after its retry delay).
    const revision = await this.repository.claim(revisionId, this.config.get('PACKET_RENDER_STALE_SECONDS', { infer: true }));
    if (!revision) {
      this.logger.debug(`packet ${revisionId} is not waiting to render (already claimed or done)`);
      return;
    }
    const started = performance.now();
    try {
      const { snapshot } = revision;
      const [photos, signatureRows, logoDataUri, issuedLocateUrl, planImage] = await Promise.all([
        this.photos.photosFor({ companyId: revision.companyId, jobId: revision.jobId, revisionId }),
        this.repository.signatures(revisionId),
        this.logo(snapshot.company.logoKey),
        this.repository.locateUrl(revisionId),
        this.planImage(snapshot.site.planImage),
      ]);
      const signatures: PacketSignature[] = signatureRows.map((s) => ({
        role: s.role,
        signerName: s.signerName,
        signedAt: s.signedAt.toISOString(),
        svgPath: s.svgPath,
      }));
      // The site's long-lived locate link, made when the revision was issued. Revisions issued before
      // locate links existed keep the address they were first printed with.
      const locateUrl = issuedLocateUrl ?? this.links.to(`/locate/${revisionId}`);
      const rendered = await this.renderer.render({ snapshot, locateUrl, photos, signatures, logoDataUri, planImage });
      const archive = await buildPacketArchive({
        snapshot,
        pdf: rendered.pdf,
        sitePlanSvg: rendered.drawings.sitePlan,
        schematicSvg: rendered.drawings.schematic,
        photos,
      });
      const base = `companies/${revision.companyId}/packets/${revisionId}`;
      try {
        const pdf = await this.storage.put(`${base}/packet-rev-${revision.revision}.pdf`, rendered.pdf, 'application/pdf');
        // ObjectStorage.put takes a Buffer; the zip was streamed to disk and is read back only to store it.
        const zip = await this.storage.put(`${base}/packet-rev-${revision.revision}.zip`, await readFile(archive.path), 'application/zip');
        if (zip.sha256 !== archive.sha256) throw new Error('the stored archive does not match the one built');
        await this.repository.markReady(revisionId, {
          pdfKey: pdf.key,
          pdfBytes: pdf.bytes,
          pdfSha256: pdf.sha256,
          pageCount: rendered.pageCount,
          zipKey: zip.key,
          zipBytes: zip.bytes,
          zipSha256: zip.sha256,
        });
      } finally {
        archive.dispose();
      }
      this.logger.log(`packet ${revisionId} rendered: ${rendered.pageCount} pages in ${Math.round(performance.now() - started)} ms`);
    } catch (error) {
      const reason = error instanceof Error ? error.message : String(error);
      await this.repository.markAttemptFailed(revisionId, reason, isFinalAttempt);
      this.logger.error(`packet ${revisionId} failed to render${isFinalAttempt ? '' : ' (will retry)'}: ${reason}`);
      throw error;
    }
  }

  /** The site plan's underlay frozen in the snapshot; a copy deleted since (image replaced) is left out. */
  private async planImage(source: PacketSnapshot['site']['planImage']): Promise<PlanImage | undefined> {
    if (!source) return undefined;
    try {
      const bytes = await this.storage.getBuffer(source.screenKey);
      return planImageForDrawing({ ...source, href: `data:image/jpeg;base64,${bytes.toString('base64')}` });
    } catch (error) {
      if (!(error instanceof ObjectNotFoundError)) throw error;
      this.logger.warn(`plan image ${source.screenKey} is no longer stored; the site plan is drawn without it`);
      return undefined;
    }
  }

  /**
   * The logo frozen in the snapshot at issue time (stored under its SHA-256, never overwritten), so a
   * re-render prints the logo the revision was issued with. Snapshots from before the company profile
   * carry no key and print no logo, as they did then.
   */
  private async logo(logoKey: string | null | undefined): Promise<string | undefined> {
    if (!logoKey) return undefined;
    const type = LOGO_TYPES[logoKey.split('.').pop()?.toLowerCase() ?? ''];
    if (!type) return undefined;
    try {
      return `data:${type};base64,${(await this.storage.getBuffer(logoKey)).toString('base64')}`;
    } catch (error) {
      if (!(error instanceof ObjectNotFoundError)) throw error;
      this.logger.warn(`logo ${logoKey} is no longer stored; the packet is printed without it`);
      return undefined;
    }
  }

}
