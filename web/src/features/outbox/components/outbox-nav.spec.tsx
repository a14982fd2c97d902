import { screen, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import type { Role } from '@domain/auth/roles';

import { buildSessionUser } from '../../../testing/data';
import { apiErrorResponse, mockApi } from '../../../testing/mock-api';
import { jsonResponse, renderApp } from '../../../testing/render-app';

const healthy = { status: 'ok', database: { status: 'up', latencyMs: 1.2 }, version: '0.1.0', uptimeSeconds: 12 };
const emptyOutbox = { items: [], total: 0, page: 1, pageSize: 25 };

async function mainNav() {
  return within(await screen.findByRole('navigation', { name: 'Main' }));
}

describe('Outbox in the navigation', () => {
  it.each<Role>(['office', 'lead', 'tech', 'homeowner'])('should not be offered to %s, nor asked for', async (role) => {
    const fetchMock = mockApi({ 'GET /api/health': () => jsonResponse(healthy) });

    renderApp({ url: '/', signedInAs: buildSessionUser(role) });

    const nav = await mainNav();
    expect(nav.getByRole('link', { name: 'Home' })).toBeInTheDocument();
    expect(nav.queryByRole('link', { name: 'Outbox' })).not.toBeInTheDocument();
    expect(fetchMock.mock.calls.some(([url]) => String(url).startsWith('/api/outbox'))).toBe(false);
  });

  it('should be offered to an admin when the server keeps local mail', async () => {
    mockApi({
      'GET /api/health': () => jsonResponse(healthy),
      'GET /api/outbox?page=1&pageSize=25': () => jsonResponse(emptyOutbox),
    });

    renderApp({ url: '/', signedInAs: buildSessionUser('admin') });

    const nav = await mainNav();
    expect(await nav.findByRole('link', { name: 'Outbox' })).toHaveAttribute('href', '/outbox');
    expect(nav.getByRole('link', { name: 'Users' })).toBeInTheDocument();
  });

  it('should be hidden from an admin when mail goes to a hosted service', async () => {
    const fetchMock = mockApi({
      'GET /api/health': () => jsonResponse(healthy),
      'GET /api/outbox?page=1&pageSize=25': () =>
        apiErrorResponse(404, { message: 'No local mail.', code: 'NO_LOCAL_MAIL' }),
    });

    renderApp({ url: '/', signedInAs: buildSessionUser('admin') });

    const nav = await mainNav();
    await nav.findByRole('link', { name: 'Users' });
    await expect.poll(() => fetchMock.mock.calls.some(([url]) => String(url).startsWith('/api/outbox'))).toBe(true);
    expect(nav.queryByRole('link', { name: 'Outbox' })).not.toBeInTheDocument();
  });

  it('should refuse the Outbox page to an office user', async () => {
    mockApi({});

    renderApp({ url: '/outbox', signedInAs: buildSessionUser('office') });

    expect(await screen.findByRole('heading', { name: 'No access to this page' })).toBeInTheDocument();
  });
});
