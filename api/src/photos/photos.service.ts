import { randomUUID } from 'node:crypto';
import type { Readable } from 'node:stream';

import { Inject, Injectable, Logger } from '@nestjs/common';

import type { AuthUser } from '../common/decorators/current-user.decorator.js';
import type { Tx } from '../db/db.module.js';
import type { NewPhotoDerivative } from '../db/schema/index.js';
import { ConflictError, findOrFail, ForbiddenError, VersionConflictError } from '../domain/errors.js';
import { canReadPhotoVariant, sanitizeFileName } from '../domain/photos/photo-rules.js';
import type {
  PhotoListResponse,
  PhotoResponse,
  PhotoTarget,
  PhotoVariant,
  UpdatePhotoInput,
  UploadPhotosFields,
  UploadPhotosResponse,
} from '../domain/photos/photo.schema.js';
import type { JobVersionResponse } from '../domain/jobs/job.schema.js';
import { invalid, jobNotFound } from '../jobs/job-errors.js';
import { JobWriter } from '../jobs/job-writer.js';
import { JobsRepository } from '../jobs/jobs.repository.js';
import { OBJECT_STORAGE, ObjectNotFoundError, type ObjectStorage } from '../storage/object-storage.js';
import { badUpload, photoNotFound } from './photo-errors.js';
import { PhotoProcessor } from './photo-processor.js';
import { targetColumns, toPhotoResponse } from './photo-response.js';
import { PhotosRepository } from './photos.repository.js';

/** The part of a Multer file the service uses (memory storage). */
export interface UploadedPhotoFile {
  originalname: string;
  buffer: Buffer;
  size: number;
}

export interface PhotoContent {
  stream: Readable;
  contentType: string;
  bytes: number;
  etag: string;
}

type WithVersion<T> = T & JobVersionResponse;

function isVersionConflict(error: unknown): boolean {
  return error instanceof VersionConflictError;
}

const fileLabel = (index: number, file: UploadedPhotoFile) => {
  const name = sanitizeFileName(file.originalname);
  return name ? `files[${index}] "${name}"` : `files[${index}]`;
};

/**
 * Photos of a job. An upload is a write to the job like any other (If-Match, crew rules, audit), but
 * the slow part runs first: the files are checked, decoded and stored before the job row is locked, so
 * a 12 MP photo does not hold the lock. If the write is then refused (stale version, rights changed),
 * the stored objects are deleted again and nothing remains.
 */
@Injectable()
export class PhotosService {
  private readonly logger = new Logger(PhotosService.name);

  constructor(
    private readonly repository: PhotosRepository,
    private readonly jobs: JobsRepository,
    private readonly writer: JobWriter,
    private readonly processor: PhotoProcessor,
    @Inject(OBJECT_STORAGE) private readonly storage: ObjectStorage,
  ) {}

  async list(actor: AuthUser, jobId: string, options: { includeDeleted: boolean }): Promise<PhotoListResponse> {
    if ((await this.repository.findJobVersion(actor.companyId, jobId)) === undefined) throw jobNotFound();
    const views = await this.repository.listByJob(jobId, options);
    return { items: views.map((view) => toPhotoResponse(view, actor.role)) };
  }

  async upload(
    actor: AuthUser,
    jobId: string,
    expectedVersion: number,
    fields: UploadPhotosFields,
    files: readonly UploadedPhotoFile[],
  ): Promise<UploadPhotosResponse> {
    if (files.length === 0) throw badUpload('attach at least one photo in the "files" field', 'files');
    const clientUploadIds = fields.clientUploadId;
    if (clientUploadIds && clientUploadIds.length !== files.length) {
      throw badUpload(`send one clientUploadId per file (${files.length} files, ${clientUploadIds.length} ids)`, 'clientUploadId');
    }
    if (clientUploadIds && new Set(clientUploadIds).size !== clientUploadIds.length) {
      throw badUpload('each file needs its own clientUploadId', 'clientUploadId');
    }
    const currentVersion = await this.repository.findJobVersion(actor.companyId, jobId);
    if (currentVersion === undefined) throw jobNotFound();

    // A retried upload (the response was lost) carries the version the client had before: answer with
    // what the first attempt stored rather than a version conflict or a second copy.
    const replay = await this.replay(actor, jobId, clientUploadIds);
    if (replay) return replay;

    // Every file's header first (type, area, side, aspect ratio: 415/413/422 in milliseconds, before
    // the job row is locked, so hostile files do not queue behind each other on that lock).
    const inspected = [];
    for (const [index, file] of files.entries()) inspected.push(await this.processor.inspect(file.buffer, fileLabel(index, file)));

    // Refuse early (404/403/409, bad target) before spending CPU on the files; checked again when writing.
    const target: PhotoTarget = fields.target ?? { type: 'job' };
    await this.jobs.transaction((tx) => this.checkWrite(actor, jobId, expectedVersion, target, tx));

    const photoIds: string[] = [];
    const storedKeys: string[] = [];
    const rows: { photo: Parameters<PhotosRepository['insert']>[0]; derivatives: NewPhotoDerivative[] }[] = [];
    try {
      // One file at a time keeps the memory of a 10-file request at one decoded photo.
      for (const [index, file] of files.entries()) {
        const label = fileLabel(index, file);
        const processed = await this.processor.process(file.buffer, label, inspected[index]);
        const photoId = randomUUID();
        const prefix = `companies/${actor.companyId}/jobs/${jobId}/photos/${photoId}`;
        const original = await this.storage.put(`${prefix}/original.${processed.extension}`, file.buffer, processed.contentType);
        storedKeys.push(original.key);
        const derivatives: NewPhotoDerivative[] = [];
        for (const derivative of processed.derivatives) {
          const stored = await this.storage.put(`${prefix}/${derivative.variant}.${derivative.extension}`, derivative.body, derivative.contentType);
          storedKeys.push(stored.key);
          derivatives.push({
            photoId,
            variant: derivative.variant,
            key: stored.key,
            width: derivative.width,
            height: derivative.height,
            bytes: stored.bytes,
            contentType: derivative.contentType,
          });
        }
        photoIds.push(photoId);
        rows.push({
          photo: {
            id: photoId,
            companyId: actor.companyId,
            jobId,
            ...targetColumns(target),
            caption: fields.caption ?? null,
            clientTakenAt: fields.takenAt ? new Date(fields.takenAt) : null,
            exifTakenAt: processed.exifTakenAt ?? null,
            gpsLat: processed.location?.lat ?? null,
            gpsLon: processed.location?.lon ?? null,
            originalKey: original.key,
            originalContentType: processed.contentType,
            originalBytes: original.bytes,
            originalName: sanitizeFileName(file.originalname),
            width: processed.width,
            height: processed.height,
            sha256: original.sha256,
            uploadedByUserId: actor.id,
            clientUploadId: clientUploadIds?.[index] ?? null,
          },
          derivatives,
        });
      }

      const { jobVersion } = await this.writer.write(actor, jobId, expectedVersion, 'field', async ({ tx }) => {
        await this.assertTarget(jobId, target, tx);
        for (const row of rows) await this.repository.insert(row.photo, row.derivatives, tx);
        return {
          result: {},
          audit: {
            action: 'job.photo.create',
            targetType: 'photo',
            targetId: photoIds[0]!,
            details: { photoIds, target, bytes: rows.reduce((sum, row) => sum + row.photo.originalBytes, 0) },
          },
        };
      });
      const views = await this.repository.findViews(photoIds);
      this.logger.log(`job ${jobId}: ${photoIds.length} photo(s) stored by user ${actor.id}`);
      return { photos: views.map((view) => toPhotoResponse(view, actor.role)), isReplay: false, jobVersion };
    } catch (error) {
      await this.deleteQuietly(storedKeys);
      // Two attempts of the same upload raced: the loser sees the winner's version bump.
      if (isVersionConflict(error)) {
        const raced = await this.replay(actor, jobId, clientUploadIds);
        if (raced) return raced;
      }
      throw error;
    }
  }

  async update(actor: AuthUser, photoId: string, expectedVersion: number, input: UpdatePhotoInput): Promise<WithVersion<{ photo: PhotoResponse }>> {
    return this.changePhoto(actor, photoId, expectedVersion, 'job.photo.update', async (photo, tx) => {
      if (photo.deletedAt) throw photoNotFound();
      if (input.target) await this.assertTarget(photo.jobId, input.target, tx);
      await this.repository.update(
        photo.id,
        {
          ...(input.caption !== undefined ? { caption: input.caption } : {}),
          ...(input.takenAt !== undefined ? { clientTakenAt: input.takenAt === null ? null : new Date(input.takenAt) } : {}),
          ...(input.target ? targetColumns(input.target) : {}),
        },
        tx,
      );
      return { changed: Object.keys(input).filter((key) => key !== 'expectedVersion') };
    });
  }

  /** Soft delete: the photo disappears from lists, packets and the map, but its files stay for undo. */
  async remove(actor: AuthUser, photoId: string, expectedVersion: number): Promise<WithVersion<{ photo: PhotoResponse }>> {
    return this.changePhoto(actor, photoId, expectedVersion, 'job.photo.delete', async (photo, tx) => {
      if (photo.deletedAt) throw photoNotFound();
      await this.repository.update(photo.id, { deletedAt: new Date() }, tx);
      return {};
    });
  }

  async restore(actor: AuthUser, photoId: string, expectedVersion: number): Promise<WithVersion<{ photo: PhotoResponse }>> {
    return this.changePhoto(actor, photoId, expectedVersion, 'job.photo.restore', async (photo, tx) => {
      if (!photo.deletedAt) throw new ConflictError('PHOTO_NOT_DELETED', 'This photo is not deleted.');
      await this.repository.update(photo.id, { deletedAt: null }, tx);
      return {};
    });
  }

  /** The bytes of one variant, for streaming. Soft-deleted photos are not served. */
  async open(actor: AuthUser, photoId: string, variant: PhotoVariant): Promise<PhotoContent> {
    const photo = await this.repository.findInCompany(actor.companyId, photoId);
    if (!photo || photo.deletedAt) throw photoNotFound();
    if (!canReadPhotoVariant(actor.role, variant)) {
      throw new ForbiddenError('ROLE_NOT_ALLOWED', 'Only company staff may download the original photo.');
    }
    const source =
      variant === 'original'
        ? { key: photo.originalKey, contentType: photo.originalContentType, bytes: photo.originalBytes }
        : await this.repository.findDerivative(photo.id, variant);
    if (!source) throw photoNotFound();
    try {
      return {
        stream: await this.storage.getStream(source.key),
        contentType: source.contentType,
        bytes: source.bytes,
        // Objects under a photo id are written once and never changed, so id + variant + hash is stable.
        etag: `"${photo.sha256.slice(0, 32)}-${variant}"`,
      };
    } catch (error) {
      if (error instanceof ObjectNotFoundError) {
        this.logger.error(`photo ${photo.id}: stored object ${source.key} is missing`);
        throw photoNotFound();
      }
      throw error;
    }
  }

  private async changePhoto(
    actor: AuthUser,
    photoId: string,
    expectedVersion: number,
    action: string,
    work: (photo: NonNullable<Awaited<ReturnType<PhotosRepository['findInCompany']>>>, tx: Tx) => Promise<Record<string, unknown>>,
  ): Promise<WithVersion<{ photo: PhotoResponse }>> {
    const found = await findOrFail(this.repository.findInCompany(actor.companyId, photoId), photoNotFound);
    const { jobVersion } = await this.writer.write(actor, found.jobId, expectedVersion, 'field', async ({ tx }) => {
      // Read again under the job's lock: writes to one job's photos run one at a time.
      const photo = await findOrFail(this.repository.findInCompany(actor.companyId, photoId, tx), photoNotFound);
      const details = await work(photo, tx);
      return { result: {}, audit: { action, targetType: 'photo', targetId: photo.id, details } };
    });
    const [view] = await this.repository.findViews([photoId]);
    if (!view) throw photoNotFound();
    return { photo: toPhotoResponse(view, actor.role), jobVersion };
  }

  private async checkWrite(actor: AuthUser, jobId: string, expectedVersion: number, target: PhotoTarget, tx: Tx): Promise<void> {
    await this.writer.lockChecked(actor, jobId, expectedVersion, 'field', tx);
    await this.assertTarget(jobId, target, tx);
  }

  private async assertTarget(jobId: string, target: PhotoTarget, tx: Tx): Promise<void> {
    if (!(await this.repository.isTargetOnJob(jobId, target, tx))) {
      const what = target.type.replace('_', ' ');
      throw invalid([{ path: 'target.id', message: `no such ${what} on this job` }]);
    }
  }

  private async replay(actor: AuthUser, jobId: string, clientUploadIds: readonly string[] | undefined): Promise<UploadPhotosResponse | undefined> {
    if (!clientUploadIds) return undefined;
    const existing = await this.repository.findByClientUploadIds(jobId, clientUploadIds);
    if (existing.length === 0) return undefined;
    if (existing.length !== clientUploadIds.length) {
      const stored = existing.map((photo) => photo.clientUploadId);
      throw new ConflictError('UPLOAD_PARTLY_STORED', `Some of these clientUploadIds were stored already (${stored.join(', ')}); upload only the others, or all of them with new ids.`);
    }
    const byClientId = new Map(existing.map((photo) => [photo.clientUploadId, photo.id]));
    const views = await this.repository.findViews(clientUploadIds.map((id) => byClientId.get(id)!));
    const jobVersion = await findOrFail(this.repository.findJobVersion(actor.companyId, jobId), jobNotFound);
    return { photos: views.map((view) => toPhotoResponse(view, actor.role)), isReplay: true, jobVersion };
  }

  /** Best effort: a failed delete leaves an orphan object, logged, never a failed request on top. */
  private async deleteQuietly(keys: readonly string[]): Promise<void> {
    for (const key of keys) {
      try {
        await this.storage.delete(key);
      } catch (error) {
        this.logger.warn(`could not delete orphaned object ${key}: ${(error as Error).message}`);
      }
    }
  }
}
