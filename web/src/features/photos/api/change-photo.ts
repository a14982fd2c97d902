import { useMutation, useQueryClient } from '@tanstack/react-query';
import { type PhotoTarget, type PhotoWriteResponse, PhotoWriteResponseSchema } from '@domain/photos/photo.schema';

import { apiRequest, isApiError } from '../../../lib/api-client';
import { getJobAsBuiltQueryOptions, type JobAsBuiltResponse } from '../../job-record';

import { getJobPhotosQueryOptions } from './get-job-photos';
import { getJobVersion } from './get-job-version';

/** A change to one photo: new caption or target, soft delete, or undoing the delete. */
export type PhotoChange =
  | { kind: 'update'; photoId: string; caption?: string | null; target?: PhotoTarget }
  | { kind: 'delete'; photoId: string }
  | { kind: 'restore'; photoId: string };

function requestOf(change: PhotoChange, version: number): Promise<PhotoWriteResponse> {
  const id = encodeURIComponent(change.photoId);
  const headers = { 'If-Match': `"${version}"` };
  if (change.kind === 'update') {
    const { caption, target } = change;
    return apiRequest(`/api/photos/${id}`, PhotoWriteResponseSchema, { method: 'PATCH', headers, body: { caption, target } });
  }
  if (change.kind === 'delete') return apiRequest(`/api/photos/${id}`, PhotoWriteResponseSchema, { method: 'DELETE', headers });
  return apiRequest(`/api/photos/${id}/restore`, PhotoWriteResponseSchema, { method: 'POST', headers });
}

/**
 * Sends `change` on top of `version`. A change touches that one photo only and nobody else's record,
 * so on a version conflict it is sent again once on the job's new version instead of asking the crew.
 */
export async function changePhoto(change: PhotoChange, version: number): Promise<PhotoWriteResponse> {
  try {
    return await requestOf(change, version);
  } catch (error) {
    if (isApiError(error) && error.code === 'VERSION_CONFLICT' && error.currentVersion !== undefined) {
      return requestOf(change, error.currentVersion);
    }
    throw error;
  }
}

/** Changes a photo of `jobId` on the version the workspace has (or the server's), then refreshes the gallery. */
export function useChangePhoto(jobId: string) {
  const queryClient = useQueryClient();
  const asBuiltKey = getJobAsBuiltQueryOptions(jobId).queryKey;
  return useMutation({
    mutationFn: async (change: PhotoChange) => {
      const version = queryClient.getQueryData<JobAsBuiltResponse>(asBuiltKey)?.job.version ?? (await getJobVersion(jobId));
      return changePhoto(change, version);
    },
    onSuccess: ({ jobVersion }) => {
      queryClient.setQueryData<JobAsBuiltResponse>(asBuiltKey, (previous) =>
        previous ? { ...previous, job: { ...previous.job, version: jobVersion } } : previous,
      );
      return queryClient.invalidateQueries({ queryKey: getJobPhotosQueryOptions(jobId).queryKey });
    },
  });
}
