import { screen, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import type { InvitationResponse } from '@domain/auth/auth.schema';

import { buildSessionUser, buildUserResponse, buildPage } from '../../../testing/data';
import { mockApi } from '../../../testing/mock-api';
import { jsonResponse, renderApp } from '../../../testing/render-app';

const FAILED_ID = '3e0a6c1b-8d2f-4a57-9b1c-6f2e0d4a8b13';

function invitation(email: string, mail: InvitationResponse['mail'], id = crypto.randomUUID()): InvitationResponse {
  return { id, email, name: null, role: 'tech', expiresAt: '2026-03-05T08:00:00.000Z', createdAt: '2026-03-02T08:00:00.000Z', mail };
}

const invitations = [
  invitation('gone.astray@fernhollow.example', { status: 'failed', attempts: 9, lastError: 'connect ECONNREFUSED 127.0.0.1:2525', sentAt: null }, FAILED_ID),
  invitation('arrived@fernhollow.example', { status: 'sent', attempts: 1, lastError: null, sentAt: '2026-03-02T08:00:05.000Z' }),
  invitation('retrying@fernhollow.example', { status: 'queued', attempts: 2, lastError: 'Greeting never received', sentAt: null }),
];

function mockUsersPage(extra: Parameters<typeof mockApi>[0] = {}) {
  return mockApi({
    'GET /api/users?pageSize=100': () => jsonResponse(buildPage([buildUserResponse('admin')])),
    'GET /api/invitations': () => jsonResponse(invitations),
    'GET /api/outbox/status': () => jsonResponse({ captured: false, destination: 'smtp://mail.relay.example:587' }),
    ...extra,
  });
}

async function itemOf(email: string) {
  const list = await screen.findByRole('list', { name: 'Waiting invitations' });
  return within(within(list).getByText(email).closest('li')!);
}

describe('InvitationsList', () => {
  it('should say where each invitation e-mail is and offer to send only a failed one again', async () => {
    mockUsersPage();
    renderApp({ url: '/users', signedInAs: buildSessionUser('office') });

    const failed = await itemOf('gone.astray@fernhollow.example');
    expect(failed.getByText('E-mail not sent after 9 tries (connect ECONNREFUSED 127.0.0.1:2525)')).toBeInTheDocument();
    expect(failed.getByRole('button', { name: 'Send the invitation to gone.astray@fernhollow.example again' })).toBeInTheDocument();

    const sent = await itemOf('arrived@fernhollow.example');
    expect(sent.getByText(/^E-mail sent /)).toBeInTheDocument();
    expect(sent.queryByRole('button', { name: /again$/ })).not.toBeInTheDocument();

    const retrying = await itemOf('retrying@fernhollow.example');
    expect(retrying.getByText(/E-mail not sent yet: the mail server did not take it; trying again/)).toBeInTheDocument();
    expect(retrying.queryByRole('button', { name: /again$/ })).not.toBeInTheDocument();
  });

  it('should queue a failed invitation again and confirm it in a toast', async () => {
    const fetchMock = mockUsersPage({
      [`POST /api/invitations/${FAILED_ID}/resend`]: () =>
        jsonResponse({ ...invitations[0], mail: { status: 'queued', attempts: 0, lastError: null, sentAt: null } }, 202),
    });
    const { user } = renderApp({ url: '/users', signedInAs: buildSessionUser('admin') });

    const failed = await itemOf('gone.astray@fernhollow.example');
    await user.click(failed.getByRole('button', { name: 'Send the invitation to gone.astray@fernhollow.example again' }));

    expect(await screen.findByText('Invitation queued again')).toBeInTheDocument();
    expect(fetchMock.mock.calls.some(([url, init]) => url === `/api/invitations/${FAILED_ID}/resend` && init?.method === 'POST')).toBe(true);
  });
});
