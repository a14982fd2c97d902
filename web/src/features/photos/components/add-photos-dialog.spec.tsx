import { FluentProvider } from '@fluentui/react-components';
import { fireEvent, render, screen, waitFor, within } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';

import { lightTheme } from '../../../app/theme';
import { createMemoryUploadStore } from '../../../lib/upload-queue-store';
import { readFixture } from '../../../testing/read-fixture';
import { setUploadQueue } from '../hooks/use-upload-queue';
import { cannotConvertMessage } from '../utils/heic-conversion';
import { UploadQueue } from '../utils/upload-queue';

import { AddPhotosDialog } from './add-photos-dialog';

/** A real HEIC (test/fixtures/photos/README.md). jsdom has no Worker or OffscreenCanvas: it cannot convert. */
const HEIC = await readFixture('photos/field-photo.heic');
const JPEG = new Uint8Array([0xff, 0xd8, 0xff, 0xe0, 0x00, 0x10, 0x4a, 0x46, 0x49, 0x46, 0x00, 0x01, 0x01, 0x00, 0x00, 0x01, 0x00, 0x01, 0x00, 0x00, 0xff, 0xd9]);

describe('AddPhotosDialog', () => {
  afterEach(() => setUploadQueue(undefined));

  it('should offer HEIC, and when this browser cannot convert one say so plainly, queue the others and stay open', async () => {
    // Nothing goes out: the queue's sender waits forever, so the test sees what was queued.
    const queue = new UploadQueue({ store: createMemoryUploadStore(), send: () => new Promise(() => undefined), getVersion: async () => 3 });
    setUploadQueue(queue);
    const onClose = vi.fn();
    render(
      <FluentProvider theme={lightTheme}>
        <AddPhotosDialog jobId="job-1" target={{ type: 'job' }} options={[{ key: 'job', target: { type: 'job' }, label: 'The job as a whole', group: 'Job' }]} onClose={onClose} />
      </FluentProvider>,
    );
    const title = await screen.findByText('Add photos', { selector: 'h2' });
    const dialog = title.closest<HTMLElement>('[role="dialog"]')!;
    const library = within(dialog).getByLabelText('Choose photos from the library');
    expect(library.getAttribute('accept')).toContain('image/heic');

    fireEvent.change(library, {
      target: { files: [new File([HEIC], 'IMG_0042.HEIC', { type: 'image/heic' }), new File([JPEG], 'trench.jpg', { type: 'image/jpeg' })] },
    });

    await within(dialog).findByText(cannotConvertMessage('IMG_0042.HEIC'));
    await waitFor(() => expect(queue.getSnapshot().map((entry) => entry.name)).toEqual(['trench.jpg']));
    expect(onClose).not.toHaveBeenCalled();
    expect(within(dialog).getByRole('button', { name: 'Close' })).toBeInTheDocument();
    queue.stop();
  });
});
