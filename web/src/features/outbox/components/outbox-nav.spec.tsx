import { screen, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import type { Role } from '@domain/auth/roles';

import { buildSessionUser } from '../../../testing/data';
import { mockApi } from '../../../testing/mock-api';
import { jsonResponse, renderApp } from '../../../testing/render-app';

const healthy = { status: 'ok', database: { status: 'up', latencyMs: 1.2 }, version: '0.1.0', uptimeSeconds: 12 };
const emptyOutbox = { items: [], total: 0, page: 1, pageSize: 25 };
const captured = { captured: true, destination: null };
const hosted = { captured: false, destination: 'smtp://mail.relay.example:587' };

async function mainNav() {
  return within(await screen.findByRole('navigation', { name: 'Main' }));
}

describe('Outbox in the navigation', () => {
  it.each<Role>(['lead', 'tech', 'homeowner'])('should not be offered to %s, nor asked for', async (role) => {
    const fetchMock = mockApi({ 'GET /api/health': () => jsonResponse(healthy) });

    renderApp({ url: '/', signedInAs: buildSessionUser(role) });

    const nav = await mainNav();
    // A homeowner's first item is their own property, never the contractor's home.
    expect(nav.getByRole('link', { name: role === 'homeowner' ? 'My property' : 'Home' })).toBeInTheDocument();
    expect(nav.queryByRole('link', { name: 'Outbox' })).not.toBeInTheDocument();
    expect(fetchMock.mock.calls.some(([url]) => String(url).startsWith('/api/outbox'))).toBe(false);
  });

  it.each<Role>(['admin', 'office'])('should be offered to %s when the server keeps local mail', async (role) => {
    mockApi({
      'GET /api/health': () => jsonResponse(healthy),
      'GET /api/outbox/status': () => jsonResponse(captured),
    });

    renderApp({ url: '/', signedInAs: buildSessionUser(role) });

    const nav = await mainNav();
    expect(await nav.findByRole('link', { name: 'Outbox' })).toHaveAttribute('href', '/outbox');
  });

  it('should be hidden when mail goes to a mail service, without asking for the list (no request bound to fail)', async () => {
    const fetchMock = mockApi({
      'GET /api/health': () => jsonResponse(healthy),
      'GET /api/outbox/status': () => jsonResponse(hosted),
    });

    renderApp({ url: '/', signedInAs: buildSessionUser('admin') });

    const nav = await mainNav();
    await nav.findByRole('link', { name: 'Users' });
    await expect.poll(() => fetchMock.mock.calls.some(([url]) => String(url) === '/api/outbox/status')).toBe(true);
    expect(nav.queryByRole('link', { name: 'Outbox' })).not.toBeInTheDocument();
    expect(fetchMock.mock.calls.some(([url]) => String(url).startsWith('/api/outbox?'))).toBe(false);
  });

  it('should say plainly on the Outbox page where mail goes when a mail service is set', async () => {
    mockApi({
      'GET /api/health': () => jsonResponse(healthy),
      'GET /api/outbox/status': () => jsonResponse(hosted),
    });

    renderApp({ url: '/outbox', signedInAs: buildSessionUser('office') });

    expect(await screen.findByText('smtp://mail.relay.example:587')).toBeInTheDocument();
    expect(screen.getByText(/goes to the mail service at/)).toBeInTheDocument();
  });

  it('should list captured mail for an office user', async () => {
    mockApi({
      'GET /api/health': () => jsonResponse(healthy),
      'GET /api/outbox/status': () => jsonResponse(captured),
      'GET /api/outbox?page=1&pageSize=25': () => jsonResponse(emptyOutbox),
    });

    renderApp({ url: '/outbox', signedInAs: buildSessionUser('office') });

    expect(await screen.findByRole('heading', { name: 'Outbox' })).toBeInTheDocument();
    expect(screen.queryByText(/goes to the mail service at/)).not.toBeInTheDocument();
  });

  it('should refuse the Outbox page to a crew lead', async () => {
    mockApi({});

    renderApp({ url: '/outbox', signedInAs: buildSessionUser('lead') });

    expect(await screen.findByRole('heading', { name: 'No access to this page' })).toBeInTheDocument();
  });
});
