import { screen, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { ROLE_LABELS, type Role } from '@domain/auth/roles';

import { buildSessionUser, buildUserResponse, buildPage } from '../../../testing/data';
import { apiErrorResponse, mockApi } from '../../../testing/mock-api';
import { jsonResponse, renderApp } from '../../../testing/render-app';

function mockUsersPage(extra: Parameters<typeof mockApi>[0] = {}) {
  return mockApi({
    'GET /api/users?pageSize=100': () => jsonResponse(buildPage([buildUserResponse('admin'), buildUserResponse('office')])),
    'GET /api/invitations': () => jsonResponse([]),
    'GET /api/outbox/status': () => jsonResponse({ captured: false, destination: 'smtp://mail.relay.example:587' }),
    ...extra,
  });
}

async function openInviteDialog(role: Role) {
  const rendered = renderApp({ url: '/users', signedInAs: buildSessionUser(role) });
  await rendered.user.click(await screen.findByRole('button', { name: 'Invite someone' }));
  // Found through its title: a role query over the whole page (every Fluent style rule checked for
  // visibility) is too slow in jsdom. `hidden` because Fluent's focus trap may mark the dialog
  // aria-hidden in jsdom, though never in Chromium (the e2e test finds it by role).
  const title = await screen.findByText('Invite someone', { selector: 'h2' });
  const dialog = title.closest<HTMLElement>('[role="dialog"]')!;
  return { ...rendered, dialog: within(dialog) };
}

describe('InviteDialog', () => {
  it.each<[Role, string[]]>([
    ['admin', ['Admin', 'Office', 'Crew lead', 'Technician', 'Homeowner']],
    ['office', ['Office', 'Crew lead', 'Technician', 'Homeowner']],
  ])('should offer a %s only the roles they may invite', async (role, expected) => {
    mockUsersPage();
    const { dialog } = await openInviteDialog(role);

    const offered = dialog.getAllByRole('radio', { hidden: true }).map((radio) => ROLE_LABELS[radio.getAttribute('value') as Role]);
    expect(offered).toEqual(expected);
  });

  it('should send the invitation and confirm it in a toast', async () => {
    const fetchMock = mockUsersPage({
      'POST /api/invitations': ({ body }) =>
        jsonResponse(
          {
            id: '7d1c3f5e-2b4a-4c6d-8e9f-0a1b2c3d4e5f',
            email: (body as { email: string }).email,
            name: null,
            role: 'lead',
            expiresAt: '2026-03-05T08:00:00.000Z',
            createdAt: '2026-03-02T08:00:00.000Z',
          },
          201,
        ),
    });
    const { user, dialog } = await openInviteDialog('office');

    await user.type(dialog.getByLabelText(/E-mail/), 'new.lead@fernhollow.example');
    await user.click(dialog.getByRole('radio', { name: /^Crew lead/, hidden: true }));
    await user.click(dialog.getByRole('button', { name: 'Send invitation', hidden: true }));

    expect(await screen.findByText('Invitation sent')).toBeInTheDocument();
    const call = fetchMock.mock.calls.find(([url, init]) => url === '/api/invitations' && init?.method === 'POST');
    expect(JSON.parse(String(call?.[1]?.body))).toEqual({ email: 'new.lead@fernhollow.example', role: 'lead' });
  });

  it('should show the API field errors and a taken e-mail on the fields', async () => {
    mockUsersPage({
      'POST /api/invitations': () => apiErrorResponse(409, { message: 'That e-mail has an account.', code: 'EMAIL_TAKEN' }),
    });
    const { user, dialog } = await openInviteDialog('admin');

    await user.type(dialog.getByLabelText(/E-mail/), 'tech@fernhollow.example');
    await user.click(dialog.getByRole('radio', { name: /^Technician/, hidden: true }));
    await user.click(dialog.getByRole('button', { name: 'Send invitation', hidden: true }));

    expect(await dialog.findByText('Someone already has an account with this e-mail.')).toBeInTheDocument();
  });

  it('should ask for a role before sending', async () => {
    const fetchMock = mockUsersPage();
    const { user, dialog } = await openInviteDialog('admin');

    await user.type(dialog.getByLabelText(/E-mail/), 'someone@fernhollow.example');
    await user.click(dialog.getByRole('button', { name: 'Send invitation', hidden: true }));

    expect(dialog.getByText('Choose what they will do in Loamline.')).toBeInTheDocument();
    expect(fetchMock.mock.calls.some(([url, init]) => url === '/api/invitations' && init?.method === 'POST')).toBe(false);
  });
});
