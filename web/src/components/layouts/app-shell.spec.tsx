import { screen, within } from '@testing-library/react';
import { beforeEach, describe, expect, it, vi } from 'vitest';

import { jsonResponse, renderApp } from '../../testing/render-app';

const healthy = {
  status: 'ok',
  database: { status: 'up', latencyMs: 1.2 },
  version: '0.1.0',
  uptimeSeconds: 12,
};

describe('AppShell', () => {
  beforeEach(() => {
    // The default user is a crew lead, who lands on Today (its jobs list); anything else gets the health answer.
    vi.spyOn(globalThis, 'fetch').mockImplementation((input) =>
      Promise.resolve(
        jsonResponse(String(input).startsWith('/api/jobs?') ? { items: [], total: 0, page: 1, pageSize: 25, nextCursor: null } : healthy),
      ),
    );
  });

  it('should show the product name as the top heading', async () => {
    renderApp();

    expect(await screen.findByRole('heading', { level: 1, name: 'Loamline' })).toBeInTheDocument();
  });

  it('should offer Home and System status in the main navigation', async () => {
    renderApp();

    // The side navigation is always in the DOM; a media query (which jsdom ignores) hides it on phones,
    // where the menu drawer takes over. The drawer is checked in Chromium: its focus trap does not
    // settle reliably in jsdom.
    const nav = await screen.findByRole('navigation', { name: 'Main' });
    expect(within(nav).getByRole('link', { name: 'Home' })).toHaveAttribute('aria-current', 'page');
    expect(within(nav).getByRole('link', { name: 'System status' })).toHaveAttribute('href', '/status');
  });
});
