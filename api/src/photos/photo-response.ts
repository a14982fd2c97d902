import type { Photo } from '../db/schema/index.js';
import type { Role } from '../domain/auth/roles.js';
import { canReadPhotoVariant } from '../domain/photos/photo-rules.js';
import { PHOTO_DERIVATIVES, type PhotoResponse, type PhotoTarget } from '../domain/photos/photo.schema.js';
import type { PhotoView } from './photos.repository.js';

export function photoUrl(photoId: string, variant: string): string {
  return `/api/photos/${photoId}/${variant}`;
}

export function targetOf(photo: Pick<Photo, 'itemId' | 'runId' | 'depthReadingId'>): PhotoTarget {
  if (photo.itemId) return { type: 'item', id: photo.itemId };
  if (photo.runId) return { type: 'run', id: photo.runId };
  if (photo.depthReadingId) return { type: 'depth_reading', id: photo.depthReadingId };
  return { type: 'job' };
}

/** The target as the photo row's three nullable references (at most one set). */
export function targetColumns(target: PhotoTarget): Pick<Photo, 'itemId' | 'runId' | 'depthReadingId'> {
  return {
    itemId: target.type === 'item' ? target.id : null,
    runId: target.type === 'run' ? target.id : null,
    depthReadingId: target.type === 'depth_reading' ? target.id : null,
  };
}

/**
 * A photo for company staff. The EXIF position and the original's URL are included only for roles
 * that may see them; nothing here is meant for packets or the public locate map, which use derivatives.
 */
export function toPhotoResponse({ photo, derivatives, uploaderName }: PhotoView, role: Role): PhotoResponse {
  const byVariant = Object.fromEntries(
    PHOTO_DERIVATIVES.map((variant) => {
      const d = derivatives.find((entry) => entry.variant === variant);
      return [
        variant,
        { url: photoUrl(photo.id, variant), width: d?.width ?? 0, height: d?.height ?? 0, bytes: d?.bytes ?? 0, contentType: d?.contentType ?? '' },
      ];
    }),
  ) as PhotoResponse['derivatives'];
  const isStaffView = canReadPhotoVariant(role, 'original');
  const clientTakenAt = photo.clientTakenAt?.toISOString() ?? null;
  const exifTakenAt = photo.exifTakenAt ? photo.exifTakenAt.replace(' ', 'T') : null;
  return {
    id: photo.id,
    jobId: photo.jobId,
    target: targetOf(photo),
    caption: photo.caption,
    takenAt: clientTakenAt ?? exifTakenAt,
    clientTakenAt,
    exifTakenAt,
    exifLocation: isStaffView && photo.gpsLat !== null && photo.gpsLon !== null ? { lat: photo.gpsLat, lon: photo.gpsLon } : null,
    width: photo.width,
    height: photo.height,
    original: {
      contentType: photo.originalContentType,
      bytes: photo.originalBytes,
      sha256: photo.sha256,
      name: photo.originalName,
      url: isStaffView ? photoUrl(photo.id, 'original') : null,
    },
    derivatives: byVariant,
    uploadedBy: photo.uploadedByUserId && uploaderName !== null ? { id: photo.uploadedByUserId, name: uploaderName } : null,
    createdAt: photo.createdAt.toISOString(),
    deletedAt: photo.deletedAt?.toISOString() ?? null,
  };
}
