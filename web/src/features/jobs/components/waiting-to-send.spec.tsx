import { act, render, screen } from '@testing-library/react';
import { MemoryRouter } from 'react-router';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';

import { publishPendingUploads } from '../../../lib/pending-uploads';
import { resetSession, setSession } from '../../../lib/session';
import { buildSessionResponse, buildSessionUser } from '../../../testing/data';
import { enqueuePendingWrite, resetPendingWritesForTests } from '../utils/pending-writes';

import { WaitingToSend } from './waiting-to-send';

describe('WaitingToSend (issue 17)', () => {
  beforeEach(() => {
    resetPendingWritesForTests();
    publishPendingUploads([]);
    setSession(buildSessionResponse(buildSessionUser('lead')));
  });
  afterEach(() => {
    publishPendingUploads([]);
    resetSession();
  });

  it('should count job changes and photos kept on this device, and lead to the job of the oldest', async () => {
    render(
      <MemoryRouter>
        <WaitingToSend />
      </MemoryRouter>,
    );
    expect(screen.queryByRole('status')).toBeNull();

    act(() => publishPendingUploads([{ jobId: 'job-photo', queuedAt: '2026-12-03T06:00:00.000Z' }]));
    expect(screen.getByRole('status')).toHaveTextContent('Waiting to send (1)');
    expect(screen.getByRole('status')).toHaveAttribute('href', '/jobs/job-photo');

    await act(() => enqueuePendingWrite('job-write', { endpoint: 'createZone', params: {}, body: { name: 'Lawn' }, label: 'New zone' }, 2));
    const link = screen.getByRole('status');
    expect(link).toHaveTextContent('Waiting to send (2)');
    expect(link, 'the photo was taken first').toHaveAttribute('href', '/jobs/job-photo');
    expect(link).toHaveAttribute('title', '1 change and 1 photo kept on this device, sent when the signal returns');

    act(() => publishPendingUploads([]));
    expect(screen.getByRole('status')).toHaveTextContent('Waiting to send (1)');
    expect(screen.getByRole('status')).toHaveAttribute('href', '/jobs/job-write');
  });
});
