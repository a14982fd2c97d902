import { queryOptions, useQuery } from '@tanstack/react-query';
import { type PhotoListResponse, PhotoListResponseSchema, type PhotoResponse } from '@domain/photos/photo.schema';

import { apiRequest } from '../../../lib/api-client';

export type { PhotoResponse };

/** The job's photos that are not deleted, oldest first. */
export function getJobPhotos(jobId: string, { signal }: { signal?: AbortSignal } = {}): Promise<PhotoListResponse> {
  return apiRequest(`/api/jobs/${encodeURIComponent(jobId)}/photos`, PhotoListResponseSchema, { signal });
}

export function getJobPhotosQueryOptions(jobId: string) {
  return queryOptions({
    queryKey: ['photos', 'list', jobId],
    queryFn: ({ signal }) => getJobPhotos(jobId, { signal }),
  });
}

export function useJobPhotos(jobId: string) {
  return useQuery(getJobPhotosQueryOptions(jobId));
}
