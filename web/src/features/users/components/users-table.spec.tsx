import { screen, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { formatDateTime } from '@domain/format/date-time';

import { buildSessionUser, buildUserResponse, buildPage } from '../../../testing/data';
import { mockApi } from '../../../testing/mock-api';
import { jsonResponse, renderApp } from '../../../testing/render-app';

const people = [
  buildUserResponse('admin'),
  buildUserResponse('tech', { isDisabled: true, lastSignInAt: null }),
  buildUserResponse('lead'),
];

function mockUsersPage(extra: Parameters<typeof mockApi>[0] = {}) {
  return mockApi({
    'GET /api/users?pageSize=100': () => jsonResponse(buildPage(people)),
    'GET /api/invitations': () => jsonResponse([]),
    'GET /api/outbox/status': () => jsonResponse({ captured: false, destination: 'smtp://mail.relay.example:587' }),
    ...extra,
  });
}

describe('UsersTable', () => {
  it('should list people sorted by name with role, status and last sign-in', async () => {
    mockUsersPage();
    renderApp({ url: '/users', signedInAs: buildSessionUser('office') });

    const grid = await screen.findByRole('grid', { name: 'People' });
    const rows = within(grid).getAllByRole('row').slice(1);
    expect(rows.map((row) => within(row).getAllByRole('gridcell')[0]?.textContent)).toEqual([
      'Ines Farrow',
      'Ossian Brackley',
      'Wren Halloway',
    ]);
    expect(within(rows[0]!).getByText('Technician')).toBeInTheDocument();
    expect(within(rows[0]!).getByText('Disabled')).toBeInTheDocument();
    expect(within(rows[0]!).getByText('Never')).toBeInTheDocument();
    // Office sees the list but changes nobody.
    expect(screen.queryByRole('button', { name: /^Change / })).not.toBeInTheDocument();
  });

  it("should write last sign-ins in the company's time zone, not the browser's (issue 16)", async () => {
    // 20:30 UTC on 2 Mar 2026 is 09:30 on 3 Mar in Auckland (NZDT, UTC+13 until 5 Apr 2026, IANA tz database).
    const company = { lengthUnits: 'metric', gaugeUnits: 'mm2', timeZone: 'Pacific/Auckland', locale: 'en-GB' } as const;
    mockUsersPage({
      'GET /api/me/preferences': () => jsonResponse({ lengthUnits: null, gaugeUnits: null, company, effective: { length: 'metric', gauge: 'mm2' } }),
      'GET /api/users?pageSize=100': () => jsonResponse(buildPage(people.map((p) => ({ ...p, lastSignInAt: '2026-03-02T20:30:00.000Z' })))),
    });
    renderApp({ url: '/users', signedInAs: buildSessionUser('office') });

    const grid = await screen.findByRole('grid', { name: 'People' });
    const auckland = formatDateTime('2026-03-02T20:30:00.000Z', { timeZone: 'Pacific/Auckland', locale: 'en-GB' });
    expect(auckland).toMatch(/^3 Mar 2026, 09:30/);
    expect((await within(grid).findAllByText(auckland)).length).toBeGreaterThan(0);
  });

  it('should let an admin change others but not themselves', async () => {
    mockUsersPage();
    renderApp({ url: '/users', signedInAs: buildSessionUser('admin') });

    await screen.findByRole('grid', { name: 'People' });
    expect(screen.getByRole('button', { name: 'Change Ines Farrow' })).toBeInTheDocument();
    expect(screen.getByRole('button', { name: 'Change Ossian Brackley' })).toBeInTheDocument();
    expect(screen.queryByRole('button', { name: 'Change Wren Halloway' })).not.toBeInTheDocument();
  });

  it('should disable an account only after confirming', async () => {
    const fetchMock = mockUsersPage({
      [`PATCH /api/users/${people[2]!.id}`]: () => jsonResponse({ ...people[2], isDisabled: true }),
    });
    const { user } = renderApp({ url: '/users', signedInAs: buildSessionUser('admin') });

    await user.click(await screen.findByRole('button', { name: 'Change Ossian Brackley' }));
    await user.click(await screen.findByText('Disable account…'));
    // Found through its title: role queries over the whole page are slow in jsdom with Fluent's styles.
    const title = await screen.findByText('Disable Ossian Brackley?', { selector: 'h2' });
    const dialog = within(title.closest<HTMLElement>('[role="alertdialog"]')!);
    expect(fetchMock.mock.calls.some(([, init]) => init?.method === 'PATCH')).toBe(false);

    await user.click(dialog.getByRole('button', { name: 'Disable account', hidden: true }));

    expect(await screen.findByText('Account disabled')).toBeInTheDocument();
    const patch = fetchMock.mock.calls.find(([, init]) => init?.method === 'PATCH');
    expect(JSON.parse(String(patch?.[1]?.body))).toEqual({ isDisabled: true });
  });
});
