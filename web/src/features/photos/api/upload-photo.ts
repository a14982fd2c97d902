import type { UploadPhotosResponse } from '@domain/photos/photo.schema';

import { apiUpload } from '../../../lib/upload';
import type { UploadSender } from '../utils/upload-queue';

/** Sends one queued photo (one file per request) as a change to `version` of its job. */
export const uploadPhoto: UploadSender = async (upload, version, { onProgress, signal }) => {
  const form = new FormData();
  form.append('target', JSON.stringify(upload.target));
  if (upload.caption) form.append('caption', upload.caption);
  form.append('clientUploadId', upload.id);
  form.append('files', upload.file, upload.name);
  const body = await apiUpload(`/api/jobs/${encodeURIComponent(upload.jobId)}/photos`, form, {
    headers: { 'If-Match': `"${version}"` },
    onProgress,
    signal,
  });
  return body as UploadPhotosResponse;
};
