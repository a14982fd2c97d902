import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import type { PhotoResponse, UploadPhotosResponse } from '@domain/photos/photo.schema';

import { ApiError } from '../../../lib/api-client';
import { createMemoryUploadStore } from '../../../lib/upload-queue-store';
import { buildSessionUser } from '../../../testing/data';
import { buildJobAsBuilt, JOB_IDS } from '../../../testing/job-data';
import { mockApi } from '../../../testing/mock-api';
import { jsonResponse, renderApp } from '../../../testing/render-app';
import { setUploadQueue } from '../hooks/use-upload-queue';
import { UploadQueue, type UploadSender } from '../utils/upload-queue';

const PHOTO_ID = '7d1e2f30-1111-4a4a-9b9b-000000000040';

function buildPhoto(overrides: Partial<PhotoResponse> = {}): PhotoResponse {
  const derivative = { url: '', width: 320, height: 320, bytes: 1000, contentType: 'image/webp' };
  return {
    id: PHOTO_ID,
    jobId: JOB_IDS.job,
    target: { type: 'run', id: JOB_IDS.run },
    caption: 'Trench at the patio, tape at 18 in',
    takenAt: '2026-04-21T10:15:00.000Z',
    clientTakenAt: null,
    exifTakenAt: '2026-04-21T10:15:00',
    exifLocation: null,
    width: 4000,
    height: 3000,
    original: { contentType: 'image/jpeg', bytes: 5_000_000, sha256: 'abc', name: 'IMG_0001.jpg', url: null },
    derivatives: { thumb: { ...derivative, url: `/api/photos/${PHOTO_ID}/thumb` }, screen: derivative, print: derivative },
    uploadedBy: { id: buildSessionUser('tech').id, name: 'Ines Farrow' },
    createdAt: '2026-04-21T10:16:00.000Z',
    deletedAt: null,
    ...overrides,
  };
}

function deferred<T>() {
  let resolve!: (value: T) => void;
  const promise = new Promise<T>((r) => (resolve = r));
  return { promise, resolve };
}

describe('PhotosSection', () => {
  beforeEach(() => {
    localStorage.clear();
    // jsdom has no object URLs; the previews only need a string.
    Object.assign(URL, { createObjectURL: vi.fn(() => 'blob:preview'), revokeObjectURL: vi.fn() });
  });
  afterEach(() => setUploadQueue(undefined));

  it('should show the gallery by target and each picked file’s progress, and the server’s reason when one is refused', async () => {
    const firstAnswer = deferred<UploadPhotosResponse>();
    const sent: { name: string; version: number; target: unknown }[] = [];
    const send: UploadSender = async (upload, version, { onProgress }) => {
      sent.push({ name: upload.name, version, target: upload.target });
      if (upload.name === 'IMG_0002.heic') {
        throw new ApiError({ status: 415, code: 'HEIC_NOT_SUPPORTED', message: 'files[0] "IMG_0002.heic" is a HEIC photo, which this server cannot read. Send JPEG instead' });
      }
      onProgress({ loaded: 50, total: 100 });
      return firstAnswer.promise;
    };
    setUploadQueue(new UploadQueue({ store: createMemoryUploadStore(), send, getVersion: async () => 3, backoffMs: () => 60_000 }));
    mockApi({
      [`GET /api/jobs/${JOB_IDS.job}/as-built`]: () => jsonResponse(buildJobAsBuilt()),
      [`GET /api/jobs/${JOB_IDS.job}/photos`]: () => jsonResponse({ items: [buildPhoto()] }),
      [`GET /api/photos/${PHOTO_ID}/thumb`]: () => new Response(new Blob([new Uint8Array([1, 2, 3])]), { headers: { 'Content-Type': 'image/webp' } }),
    });
    const { user } = renderApp({ url: `/jobs/${JOB_IDS.job}?section=photos`, signedInAs: buildSessionUser('lead') });

    // The first load renders the whole workspace (lazy routes, Fluent styles): slow when every project runs at once.
    await screen.findByRole('heading', { name: 'Photos (1)' }, { timeout: 10_000 });
    const gallery = screen.getByRole('list', { name: 'Photos of Run Patio trunk' });
    expect(within(gallery).getByRole('button', { name: 'Open photo: Trench at the patio, tape at 18 in' })).toBeInTheDocument();

    await user.click(screen.getByRole('button', { name: 'Add photos' }));
    // Fluent's dialog counts as hidden in jsdom (it animates in); find it by its title.
    const title = await screen.findByText('Add photos', { selector: 'h2' });
    const dialog = title.closest<HTMLElement>('[role="dialog"]')!;
    await user.selectOptions(within(dialog).getByLabelText('The photos show'), `run:${JOB_IDS.run}`);
    fireEvent.change(within(dialog).getByLabelText('Choose photos from the library'), {
      target: { files: [new File(['jpeg'], 'IMG_0001.jpg', { type: 'image/jpeg' }), new File(['heic'], 'IMG_0002.heic', { type: 'image/heic' })] },
    });

    const uploads = await screen.findByRole('list', { name: 'Uploads' });
    const first = within(uploads).getByRole('listitem', { name: 'IMG_0001.jpg' });
    await within(first).findByText('Uploading 50 %');
    expect(within(first).getByRole('progressbar', { name: 'Upload of IMG_0001.jpg' })).toBeInTheDocument();
    expect(within(uploads).getByRole('listitem', { name: 'IMG_0002.heic' })).toHaveTextContent('Waiting to send');

    firstAnswer.resolve({ photos: [buildPhoto({ id: 'new-photo' })], isReplay: false, jobVersion: 4 });
    await within(first).findByText('Uploaded');
    const second = within(uploads).getByRole('listitem', { name: 'IMG_0002.heic' });
    await within(second).findByText(/^Not sent: .*HEIC photo, which this server cannot read. Send JPEG instead/);
    expect(within(second).getByRole('button', { name: 'Try IMG_0002.heic again now' })).toBeInTheDocument();
    expect(sent.map((s) => s.name)).toEqual(['IMG_0001.jpg', 'IMG_0002.heic']);
    expect(sent[0]).toMatchObject({ version: 3, target: { type: 'run', id: JOB_IDS.run } });
    await waitFor(() => expect(screen.getByText('Sending 1 photo')).toBeInTheDocument());
  }, 30_000);
});
