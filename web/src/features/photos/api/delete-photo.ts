import { type PhotoWriteResponse, PhotoWriteResponseSchema } from '@domain/photos/photo.schema';

import { apiRequest } from '../../../lib/api-client';

import { photoIfMatch, usePhotoWrite } from './photo-write';

/** Deletes a photo softly (DELETE /api/photos/:id; restore-photo undoes it) on top of the job's `version`. */
export function deletePhoto({ photoId }: { photoId: string }, version: number): Promise<PhotoWriteResponse> {
  return apiRequest(`/api/photos/${encodeURIComponent(photoId)}`, PhotoWriteResponseSchema, { method: 'DELETE', headers: photoIfMatch(version) });
}

/** Deletes a photo of `jobId` (a conflict is retried once on the job's new version), then refreshes the gallery. */
export function useDeletePhoto(jobId: string) {
  return usePhotoWrite(jobId, deletePhoto);
}
