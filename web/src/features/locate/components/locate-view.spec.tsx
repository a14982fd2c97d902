import { screen, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';

import { apiErrorResponse, mockApi } from '../../../testing/mock-api';
import { jsonResponse, renderApp } from '../../../testing/render-app';
import { buildLocateView } from '../testing-fixtures';

describe('Locate view', () => {
  it('should show the cautions, the installer, the map with depths and a run’s profile and photos, signed out', async () => {
    const fetchMock = mockApi({ 'GET /api/locate/tok': () => jsonResponse(buildLocateView('tok')) });

    const { user } = renderApp({ url: '/locate/tok', signedInAs: null });

    expect(await screen.findByRole('heading', { name: 'Before you dig' }, { timeout: 15_000 })).toBeInTheDocument();
    expect(screen.getByText(/one-call locators do not mark them/)).toBeInTheDocument();
    expect(screen.getByText('Hand-dig within 18 in of any line on this map.')).toBeInTheDocument();
    expect(screen.getByText(/Depths are as installed/)).toBeInTheDocument();
    expect(screen.getByText('Buried cables · Garden Sound Co')).toBeInTheDocument();
    expect(screen.getByRole('link', { name: /Call the installer: \+1 555 0100/ })).toHaveAttribute('href', 'tel:+15550100');
    expect(screen.getByRole('link', { name: /E-mail office@gardensound.test/ })).toHaveAttribute('href', 'mailto:office@gardensound.test');
    expect(screen.queryByRole('navigation', { name: 'Main' })).not.toBeInTheDocument();

    const map = screen.getByRole('img', { name: /Site plan/ });
    expect(within(map).getByText('min 12 in')).toBeInTheDocument();
    expect(within(map).getByText('Wall entry: Garage wall')).toBeInTheDocument();
    expect(within(map).getByText('House corner NE')).toBeInTheDocument();
    expect(screen.getByRole('link', { name: 'Download GeoJSON' })).toHaveAttribute('href', '/api/locate/tok/map.geojson');

    await user.click(screen.getByRole('button', { name: /Run A/ }));
    expect(screen.getByRole('img', { name: 'Depth profile of Run A' })).toHaveAttribute('src', '/api/locate/tok/runs/run-1/depth-profile.svg');
    await user.click(screen.getByRole('button', { name: 'Open trench by the fence' }));
    expect(screen.getAllByRole('img', { name: 'Open trench by the fence' }).map((img) => img.getAttribute('src'))).toContain('/api/locate/tok/photos/p1/screen');

    // Public: no token is sent.
    const [, init] = fetchMock.mock.calls.find(([url]) => String(url) === '/api/locate/tok')!;
    expect(new Headers(init?.headers).has('Authorization')).toBe(false);
  });

  it('should show only a clear page for a link that no longer works', async () => {
    mockApi({ 'GET /api/locate/gone': () => apiErrorResponse(404, { message: 'Not valid.', code: 'LOCATE_LINK_NOT_VALID' }) });

    renderApp({ url: '/locate/gone', signedInAs: null });

    expect(await screen.findByRole('heading', { name: 'This link no longer works' })).toBeInTheDocument();
    expect(screen.getByText(/Ask the homeowner for a new one/)).toBeInTheDocument();
    expect(screen.queryByText(/Before you dig/)).not.toBeInTheDocument();
    expect(screen.queryByRole('img')).not.toBeInTheDocument();
  });

  it('should ask to wait when rate-limited', async () => {
    const fetchMock = mockApi({ 'GET /api/locate/busy': () => apiErrorResponse(429, { message: 'Too many requests.' }) });

    renderApp({ url: '/locate/busy', signedInAs: null });

    expect(await screen.findByRole('heading', { name: 'Too many tries, wait a minute' })).toBeInTheDocument();
    expect(fetchMock.mock.calls.filter(([url]) => String(url) === '/api/locate/busy')).toHaveLength(1);
  });
});
