import { type PhotoTarget, type PhotoWriteResponse, PhotoWriteResponseSchema } from '@domain/photos/photo.schema';

import { apiRequest } from '../../../lib/api-client';

import { photoIfMatch, usePhotoWrite } from './photo-write';

export type PhotoUpdate = { photoId: string; caption?: string | null; target?: PhotoTarget };

/** A photo's new caption or target (PATCH /api/photos/:id) on top of the job's `version`. */
export function updatePhoto({ photoId, caption, target }: PhotoUpdate, version: number): Promise<PhotoWriteResponse> {
  return apiRequest(`/api/photos/${encodeURIComponent(photoId)}`, PhotoWriteResponseSchema, {
    method: 'PATCH',
    headers: photoIfMatch(version),
    body: { caption, target },
  });
}

/** Changes a photo of `jobId` (a conflict is retried once on the job's new version), then refreshes the gallery. */
export function useUpdatePhoto(jobId: string) {
  return usePhotoWrite(jobId, updatePhoto);
}
