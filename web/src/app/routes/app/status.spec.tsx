import { screen, within } from '@testing-library/react';
import { describe, expect, it, vi } from 'vitest';

import { jsonResponse, renderApp } from '../../../testing/render-app';

const healthy = {
  status: 'ok',
  database: { status: 'up', latencyMs: 1.2 },
  version: '0.1.0',
  uptimeSeconds: 12,
};

const databaseDown = {
  status: 'error',
  database: { status: 'down', error: 'connection refused' },
  version: '0.1.0',
  uptimeSeconds: 40,
};

async function findDetails() {
  return within(await screen.findByLabelText('Health details'));
}

describe('StatusRoute', () => {
  it('should show the server and database up with the latency for a healthy answer', async () => {
    const fetchMock = vi.spyOn(globalThis, 'fetch').mockResolvedValue(jsonResponse(healthy));

    renderApp({ url: '/status' });

    expect(await screen.findByText('Everything is working')).toBeInTheDocument();
    const details = await findDetails();
    expect(details.getAllByText('Up')).toHaveLength(2);
    expect(details.getByText('1.2 ms')).toBeInTheDocument();
    expect(details.getByText('0.1.0')).toBeInTheDocument();
    expect(details.getByText('12 s')).toBeInTheDocument();
    expect(fetchMock).toHaveBeenCalledWith('/api/health', expect.objectContaining({ credentials: 'include' }));
  });

  it('should say plainly that the database is down for a 503 report', async () => {
    vi.spyOn(globalThis, 'fetch').mockResolvedValue(jsonResponse(databaseDown, 503));

    renderApp({ url: '/status' });

    expect(await screen.findByText('The database is down')).toBeInTheDocument();
    expect(screen.getByText(/connection refused/)).toBeInTheDocument();
    const details = await findDetails();
    expect(details.getByText('Up')).toBeInTheDocument();
    expect(details.getByText('Down')).toBeInTheDocument();
  });

  it('should say the server cannot be reached when there is no answer', async () => {
    vi.spyOn(globalThis, 'fetch').mockRejectedValue(new TypeError('Failed to fetch'));

    renderApp({ url: '/status' });

    expect(await screen.findByText('The server cannot be reached')).toBeInTheDocument();
    expect(screen.getByText('Unknown')).toBeInTheDocument();
  });

  it('should check again when Refresh is pressed', async () => {
    const fetchMock = vi
      .spyOn(globalThis, 'fetch')
      .mockResolvedValueOnce(jsonResponse(databaseDown, 503))
      .mockResolvedValue(jsonResponse(healthy));
    const { user } = renderApp({ url: '/status' });
    expect(await screen.findByText('The database is down')).toBeInTheDocument();

    await user.click(screen.getByRole('button', { name: 'Refresh' }));

    expect(await screen.findByText('Everything is working')).toBeInTheDocument();
    expect(fetchMock).toHaveBeenCalledTimes(2);
  });
});
