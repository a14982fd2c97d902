import { FluentProvider } from '@fluentui/react-components';
import { QueryClientProvider } from '@tanstack/react-query';
import { render, screen, within } from '@testing-library/react';
import { beforeEach, describe, expect, it } from 'vitest';

import { lightTheme } from '../../../app/theme';
import { setSession } from '../../../lib/session';
import { buildSessionResponse, buildSessionUser } from '../../../testing/data';
import { mockApi } from '../../../testing/mock-api';
import { createTestQueryClient, jsonResponse } from '../../../testing/render-app';
import type { PacketRevision } from '../../delivery';

import { PacketCard } from './packet-card';

const JOB_ID = '7d1e2f30-1111-4a4a-9b9b-000000000001';

function revision(overrides: Partial<PacketRevision>): PacketRevision {
  return {
    id: '7d1e2f30-2222-4a4a-9b9b-000000000001',
    jobId: JOB_ID,
    revision: 1,
    status: 'queued',
    failureReason: null,
    attempts: 0,
    paperSize: 'letter',
    pageCount: null,
    pdf: null,
    archive: null,
    issuedByUserId: null,
    issuedAt: '2026-05-20T17:00:00Z',
    renderedAt: null,
    ...overrides,
  };
}

function renderCard() {
  setSession(buildSessionResponse(buildSessionUser('office')));
  return render(
    <FluentProvider theme={lightTheme}>
      <QueryClientProvider client={createTestQueryClient()}>
        <PacketCard jobId={JOB_ID} />
      </QueryClientProvider>
    </FluentProvider>,
  );
}

describe('PacketCard', () => {
  beforeEach(() => localStorage.clear());

  it('should follow the render queued → rendering → ready and offer the downloads (issuing is at the top of the job page)', async () => {
    const answers = [[revision({ status: 'queued' })], [revision({ status: 'rendering', attempts: 1 })]];
    const ready = revision({
      status: 'ready',
      attempts: 1,
      pageCount: 18,
      pdf: { bytes: 10, sha256: 'a'.repeat(64), url: '/api/packets/x/pdf' },
      archive: { bytes: 20, sha256: 'b'.repeat(64), url: '/api/packets/x/archive.zip' },
    });
    mockApi({
      [`GET /api/jobs/${JOB_ID}/packets`]: () => jsonResponse(answers.shift() ?? [ready]),
      [`GET /api/jobs/${JOB_ID}/deliveries`]: () => jsonResponse([]),
    });
    renderCard();
    expect(screen.queryByRole('button', { name: 'Issue packet' })).not.toBeInTheDocument();
    expect(await screen.findByText('Queued for rendering')).toBeInTheDocument();
    expect(screen.getByRole('progressbar')).toBeInTheDocument();
    // Polled every 2 s while queued or rendering.
    expect(await screen.findByText('Rendering the PDF', undefined, { timeout: 5_000 })).toBeInTheDocument();
    const row = await screen.findByRole('listitem', { name: 'Revision 1' }, { timeout: 5_000 });
    await within(row).findByText(/Ready, 18 pages/, undefined, { timeout: 5_000 });
    expect(within(row).getByRole('button', { name: 'Download PDF' })).toBeInTheDocument();
    expect(within(row).getByRole('button', { name: 'Download archive (zip)' })).toBeInTheDocument();
    // The office may send a ready revision to the homeowner.
    expect(within(row).getByRole('button', { name: 'Send to homeowner' })).toBeInTheDocument();
    expect(screen.queryByRole('progressbar')).not.toBeInTheDocument();
  }, 20_000);

  it('should show a failed render with its reason', async () => {
    mockApi({
      [`GET /api/jobs/${JOB_ID}/packets`]: () =>
        jsonResponse([revision({ status: 'failed', attempts: 3, failureReason: 'Chromium timed out after 60 s' })]),
      [`GET /api/jobs/${JOB_ID}/deliveries`]: () => jsonResponse([]),
    });
    renderCard();
    expect(await screen.findByText('Failed')).toBeInTheDocument();
    expect(screen.getByText('Reason: Chromium timed out after 60 s')).toBeInTheDocument();
    expect(screen.queryByRole('button', { name: 'Issue packet' })).not.toBeInTheDocument();
    expect(screen.queryByRole('button', { name: 'Download PDF' })).not.toBeInTheDocument();
    expect(screen.queryByRole('button', { name: 'Send to homeowner' })).not.toBeInTheDocument();
  });
});
