import { type PhotoWriteResponse, PhotoWriteResponseSchema } from '@domain/photos/photo.schema';

import { apiRequest } from '../../../lib/api-client';

import { photoIfMatch, usePhotoWrite } from './photo-write';

/** Undoes a photo's delete (POST /api/photos/:id/restore) on top of the job's `version`. */
export function restorePhoto({ photoId }: { photoId: string }, version: number): Promise<PhotoWriteResponse> {
  return apiRequest(`/api/photos/${encodeURIComponent(photoId)}/restore`, PhotoWriteResponseSchema, { method: 'POST', headers: photoIfMatch(version) });
}

/** Restores a deleted photo of `jobId` (a conflict is retried once on the job's new version), then refreshes the gallery. */
export function useRestorePhoto(jobId: string) {
  return usePhotoWrite(jobId, restorePhoto);
}
