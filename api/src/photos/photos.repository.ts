import { Inject, Injectable } from '@nestjs/common';
import { and, asc, eq, inArray, isNull } from 'drizzle-orm';

import { DB, type Db, type Tx } from '../db/db.module.js';
import {
  depthReadings,
  items,
  jobs,
  type NewPhoto,
  type NewPhotoDerivative,
  type Photo,
  type PhotoDerivative,
  photoDerivatives,
  photos,
  runs,
  users,
} from '../db/schema/index.js';
import type { PhotoDerivativeVariant, PhotoTarget } from '../domain/photos/photo.schema.js';

/** A photo with its derivatives and uploader's name: everything its response needs. */
export interface PhotoView {
  photo: Photo;
  derivatives: PhotoDerivative[];
  uploaderName: string | null;
}

@Injectable()
export class PhotosRepository {
  constructor(@Inject(DB) private readonly db: Db) {}

  transaction<T>(work: (tx: Tx) => Promise<T>): Promise<T> {
    return this.db.transaction(work);
  }

  /** The job's version when it belongs to the company, else undefined. */
  async findJobVersion(companyId: string, jobId: string, tx?: Tx): Promise<number | undefined> {
    const [row] = await (tx ?? this.db)
      .select({ version: jobs.version })
      .from(jobs)
      .where(and(eq(jobs.companyId, companyId), eq(jobs.id, jobId)));
    return row?.version;
  }

  /** True when the target (an item, run or depth reading) is part of the job; the job itself always is. */
  async isTargetOnJob(jobId: string, target: PhotoTarget, tx?: Tx): Promise<boolean> {
    const db = tx ?? this.db;
    switch (target.type) {
      case 'job':
        return true;
      case 'item':
        return (await db.select({ id: items.id }).from(items).where(and(eq(items.jobId, jobId), eq(items.id, target.id)))).length > 0;
      case 'run':
        return (await db.select({ id: runs.id }).from(runs).where(and(eq(runs.jobId, jobId), eq(runs.id, target.id)))).length > 0;
      case 'depth_reading':
        return (
          (
            await db
              .select({ id: depthReadings.id })
              .from(depthReadings)
              .innerJoin(runs, eq(runs.id, depthReadings.runId))
              .where(and(eq(runs.jobId, jobId), eq(depthReadings.id, target.id)))
          ).length > 0
        );
    }
  }

  /** A photo of the company (deleted ones included), or undefined: another company's id looks absent. */
  async findInCompany(companyId: string, id: string, tx?: Tx): Promise<Photo | undefined> {
    const [row] = await (tx ?? this.db)
      .select()
      .from(photos)
      .where(and(eq(photos.companyId, companyId), eq(photos.id, id)));
    return row;
  }

  async findDerivative(photoId: string, variant: PhotoDerivativeVariant, tx?: Tx): Promise<PhotoDerivative | undefined> {
    const [row] = await (tx ?? this.db)
      .select()
      .from(photoDerivatives)
      .where(and(eq(photoDerivatives.photoId, photoId), eq(photoDerivatives.variant, variant)));
    return row;
  }

  /** Photos of a job already stored under these client upload ids. */
  async findByClientUploadIds(jobId: string, clientUploadIds: readonly string[], tx?: Tx): Promise<Photo[]> {
    // Guard against running an invalid `IN ()` query when no ids were sent.
    if (clientUploadIds.length === 0) return [];
    return (tx ?? this.db)
      .select()
      .from(photos)
      .where(and(eq(photos.jobId, jobId), inArray(photos.clientUploadId, [...clientUploadIds])));
  }

  /** The job's photos, oldest first, without soft-deleted ones unless asked. */
  async listByJob(jobId: string, options: { includeDeleted: boolean }, tx?: Tx): Promise<PhotoView[]> {
    const db = tx ?? this.db;
    const rows = await db
      .select({ photo: photos, uploaderName: users.name })
      .from(photos)
      .leftJoin(users, eq(users.id, photos.uploadedByUserId))
      .where(and(eq(photos.jobId, jobId), options.includeDeleted ? undefined : isNull(photos.deletedAt)))
      .orderBy(asc(photos.createdAt), asc(photos.id));
    return this.withDerivatives(rows, db);
  }

  /** The photos with these ids, in the order given. */
  async findViews(ids: readonly string[], tx?: Tx): Promise<PhotoView[]> {
    // Guard against running an invalid `IN ()` query when there is nothing to load.
    if (ids.length === 0) return [];
    const db = tx ?? this.db;
    const rows = await db
      .select({ photo: photos, uploaderName: users.name })
      .from(photos)
      .leftJoin(users, eq(users.id, photos.uploadedByUserId))
      .where(inArray(photos.id, [...ids]));
    const views = await this.withDerivatives(rows, db);
    return ids.flatMap((id) => views.filter((view) => view.photo.id === id));
  }

  private async withDerivatives(rows: { photo: Photo; uploaderName: string | null }[], db: Db | Tx): Promise<PhotoView[]> {
    // Guard against running an invalid `IN ()` query for a job without photos.
    if (rows.length === 0) return [];
    const derivatives = await db
      .select()
      .from(photoDerivatives)
      .where(inArray(photoDerivatives.photoId, rows.map((row) => row.photo.id)));
    return rows.map((row) => ({ ...row, derivatives: derivatives.filter((d) => d.photoId === row.photo.id) }));
  }

  async insert(photo: NewPhoto, derivatives: readonly NewPhotoDerivative[], tx: Tx): Promise<void> {
    await tx.insert(photos).values(photo);
    if (derivatives.length > 0) await tx.insert(photoDerivatives).values([...derivatives]);
  }

  async update(id: string, patch: Partial<Pick<NewPhoto, 'caption' | 'clientTakenAt' | 'itemId' | 'runId' | 'depthReadingId' | 'deletedAt'>>, tx: Tx): Promise<void> {
    await tx.update(photos).set(patch).where(eq(photos.id, id));
  }
}
