import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { PhotoWriteResponse } from '@domain/photos/photo.schema';

import { isApiError } from '../../../lib/api-client';
import { getJobAsBuiltQueryOptions, type JobAsBuiltResponse } from '../../job-record';

import { getJobPhotosQueryOptions } from './get-job-photos';
import { getJobVersion } from './get-job-version';

/** Every photo write names the job version it builds on (`If-Match`), as job writes do. */
export function photoIfMatch(version: number): Record<string, string> {
  return { 'If-Match': `"${version}"` };
}

/**
 * Runs `send` on top of `version`. A photo write touches that one photo only and nobody else's record,
 * so on a version conflict it is sent again once on the job's new version instead of asking the crew.
 */
export async function sendPhotoWrite(send: (version: number) => Promise<PhotoWriteResponse>, version: number): Promise<PhotoWriteResponse> {
  try {
    return await send(version);
  } catch (error) {
    if (isApiError(error) && error.code === 'VERSION_CONFLICT' && error.currentVersion !== undefined) {
      return send(error.currentVersion);
    }
    throw error;
  }
}

/**
 * The mutation of a photo write of `jobId` (the hooks of update-photo, delete-photo and restore-photo):
 * sent on the job version the workspace has (or the server's), then the job's new version goes into the
 * cached as-built and the gallery is refreshed.
 */
export function usePhotoWrite<A>(jobId: string, send: (args: A, version: number) => Promise<PhotoWriteResponse>) {
  const queryClient = useQueryClient();
  const asBuiltKey = getJobAsBuiltQueryOptions(jobId).queryKey;
  return useMutation({
    mutationFn: async (args: A) => {
      const version = queryClient.getQueryData<JobAsBuiltResponse>(asBuiltKey)?.job.version ?? (await getJobVersion(jobId));
      return sendPhotoWrite((v) => send(args, v), version);
    },
    onSuccess: ({ jobVersion }) => {
      queryClient.setQueryData<JobAsBuiltResponse>(asBuiltKey, (previous) =>
        previous ? { ...previous, job: { ...previous.job, version: jobVersion } } : previous,
      );
      return queryClient.invalidateQueries({ queryKey: getJobPhotosQueryOptions(jobId).queryKey });
    },
  });
}
