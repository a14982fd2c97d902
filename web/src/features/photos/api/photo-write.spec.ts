import type { PhotoResponse } from '@domain/photos/photo.schema';
import { afterEach, describe, expect, it, vi } from 'vitest';

import { JOB_IDS } from '../../../testing/job-data';
import { apiErrorResponse, mockApi, type MockRequest } from '../../../testing/mock-api';
import { jsonResponse } from '../../../testing/render-app';

import { deletePhoto } from './delete-photo';
import { sendPhotoWrite } from './photo-write';
import { restorePhoto } from './restore-photo';
import { updatePhoto } from './update-photo';

const PHOTO_ID = 'photo/1';

function buildPhoto(): PhotoResponse {
  const derivative = { url: '', width: 320, height: 320, bytes: 1000, contentType: 'image/webp' };
  return {
    id: PHOTO_ID,
    jobId: JOB_IDS.job,
    target: { type: 'run', id: JOB_IDS.run },
    caption: 'Conduit at the gate',
    takenAt: '2026-04-21T10:15:00.000Z',
    clientTakenAt: null,
    exifTakenAt: null,
    exifLocation: null,
    width: 4000,
    height: 3000,
    original: { contentType: 'image/jpeg', bytes: 5_000_000, sha256: 'abc', name: 'IMG_0001.jpg', url: null },
    derivatives: { thumb: derivative, screen: derivative, print: derivative },
    uploadedBy: { id: 'u1', name: 'Ines Farrow' },
    createdAt: '2026-04-21T10:16:00.000Z',
    deletedAt: null,
  };
}

const answer = (jobVersion: number) => jsonResponse({ photo: buildPhoto(), jobVersion });

describe('photo write endpoints (one file per route)', () => {
  afterEach(() => vi.restoreAllMocks());

  it.each([
    ['update-photo', 'PATCH /api/photos/photo%2F1', () => updatePhoto({ photoId: PHOTO_ID, caption: 'Gate', target: { type: 'run', id: JOB_IDS.run } }, 3), { caption: 'Gate', target: { type: 'run', id: JOB_IDS.run } }],
    ['delete-photo', 'DELETE /api/photos/photo%2F1', () => deletePhoto({ photoId: PHOTO_ID }, 3), undefined],
    ['restore-photo', 'POST /api/photos/photo%2F1/restore', () => restorePhoto({ photoId: PHOTO_ID }, 3), undefined],
  ])('%s should send its own route on top of the job version', async (_file, route, send, body) => {
    const seen: MockRequest[] = [];
    mockApi({
      [route]: (request) => {
        seen.push(request);
        return answer(4);
      },
    });
    expect(await send()).toMatchObject({ jobVersion: 4, photo: { id: PHOTO_ID } });
    expect(seen).toHaveLength(1);
    expect(seen[0]!.headers.get('If-Match')).toBe('"3"');
    expect(seen[0]!.body).toEqual(body);
  });

  it('should send a photo write again once on the job’s new version after a conflict, and not twice', async () => {
    const versions: (string | null)[] = [];
    mockApi({
      'DELETE /api/photos/photo%2F1': ({ headers }) => {
        versions.push(headers.get('If-Match'));
        return versions.length === 1 ? apiErrorResponse(412, { message: 'stale', code: 'VERSION_CONFLICT', currentVersion: 7 }) : answer(8);
      },
    });
    expect(await sendPhotoWrite((version) => deletePhoto({ photoId: PHOTO_ID }, version), 3)).toMatchObject({ jobVersion: 8 });
    expect(versions).toEqual(['"3"', '"7"']);

    versions.length = 0;
    mockApi({
      'DELETE /api/photos/photo%2F1': ({ headers }) => {
        versions.push(headers.get('If-Match'));
        return apiErrorResponse(412, { message: 'stale', code: 'VERSION_CONFLICT', currentVersion: 9 });
      },
    });
    await expect(sendPhotoWrite((version) => deletePhoto({ photoId: PHOTO_ID }, version), 3)).rejects.toMatchObject({ code: 'VERSION_CONFLICT' });
    expect(versions).toEqual(['"3"', '"9"']);
  });
});
