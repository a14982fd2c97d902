import { render, screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';

import { apiErrorResponse, mockApi } from '../../../testing/mock-api';
import { jsonResponse } from '../../../testing/render-app';
import { loadLocateView } from '../api/get-locate-view';
import { buildLocateView } from '../testing-fixtures';

import { LocatePage } from './locate-page';

/** The locate page (locate.html) as locate-main.tsx starts it, for `/locate/<token>`, signed out. */
function renderLocate(token: string, retryDelaysMs: readonly number[] = []) {
  window.history.replaceState(null, '', `/locate/${token}`);
  const user = userEvent.setup();
  render(<LocatePage view={loadLocateView(token, retryDelaysMs)} />);
  return { user };
}

describe('Locate view', () => {
  beforeAll(() => window.history.replaceState(null, '', '/'));
  afterAll(() => window.history.replaceState(null, '', '/'));

  it('should show the cautions, the installer, the map with depths and a run’s profile and photos, signed out', async () => {
    const fetchMock = mockApi({ 'GET /api/locate/tok': () => jsonResponse(buildLocateView('tok')) });

    const { user } = renderLocate('tok');

    expect(await screen.findByRole('heading', { name: 'Before you dig' }, { timeout: 15_000 })).toBeInTheDocument();
    expect(screen.getByText(/one-call locators do not mark them/)).toBeInTheDocument();
    expect(screen.getByText('Hand-dig within 18 in of any line on this map.')).toBeInTheDocument();
    expect(screen.getByText(/Depths are as installed/)).toBeInTheDocument();
    expect(screen.getByText('Buried cables · Garden Sound Co')).toBeInTheDocument();
    expect(screen.getByRole('link', { name: /Call the installer: \+1 555 0100/ })).toHaveAttribute('href', 'tel:+15550100');
    expect(screen.getByRole('link', { name: /E-mail office@gardensound.test/ })).toHaveAttribute('href', 'mailto:office@gardensound.test');
    expect(screen.queryByRole('navigation', { name: 'Main' })).not.toBeInTheDocument();

    const map = await screen.findByRole('img', { name: /Site plan/ });
    // Labels are placed once the map has fitted the site to its frame.
    expect(await within(map).findByText('Run A: min 12 in')).toBeInTheDocument();
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
  }, 60_000);

  it('should write the caution box with the shared formatter and the company spelling: a metric en-GB company reads 0.5 m and centre', async () => {
    mockApi({ 'GET /api/locate/tok': () => jsonResponse({ ...buildLocateView('tok'), units: 'metric', locale: 'en-GB' }) });
    renderLocate('tok');
    expect(await screen.findByRole('heading', { name: 'Before you dig' }, { timeout: 15_000 })).toBeInTheDocument();
    // As the packet and locate sheet print it (rounded up to 0.1 m), not the raw 45.7 cm.
    expect(screen.getByText('Hand-dig within 0.5 m of any line on this map.')).toBeInTheDocument();
    expect(screen.getByText('Call the one-call centre (811 in the United States) before any digging.')).toBeInTheDocument();
  }, 60_000);

  it('should spell center for an en-US company', async () => {
    mockApi({ 'GET /api/locate/tok': () => jsonResponse(buildLocateView('tok')) });
    renderLocate('tok');
    expect(await screen.findByText('Call the one-call center (811 in the United States) before any digging.', undefined, { timeout: 15_000 })).toBeInTheDocument();
  }, 60_000);

  it('should list shallow runs first with the rule, toggle the ties and list what to measure from', async () => {
    const view = buildLocateView('tok');
    const second = { ...view.runs[0]!, id: 'run-2', label: 'Run B', minDepthM: 0.1016, maxDepthM: 0.2, minCoverM: 0.1524, isShallow: true, photos: [] };
    view.runs = [view.runs[0]!, second];
    view.map.runs = [view.map.runs[0]!, { ...view.map.runs[0]!, id: 'run-2', label: 'Run B', minDepthM: 0.1016, isShallow: true, route: [{ x: 1, y: 1 }, { x: 1, y: 8 }] }];
    view.map.items[1]!.ties = [{ referencePointId: 'rp-1', distanceM: Math.hypot(9, 6) }];
    mockApi({ 'GET /api/locate/tok': () => jsonResponse(view) });
    const { user } = renderLocate('tok');
    expect(await screen.findByRole('heading', { name: 'Cable runs' }, { timeout: 15_000 })).toBeInTheDocument();

    const items = screen.getAllByRole('listitem').filter((li) => li.id.startsWith('locate-run-'));
    expect(items.map((li) => li.id)).toEqual(['locate-run-run-2', 'locate-run-run-1']);
    expect(within(items[0]!).getByText(/Shallower than the depth rule: 4 in where the rule asks 6 in/)).toBeInTheDocument();

    const map = await screen.findByRole('img', { name: /Site plan/ });
    expect(await within(map).findByText('⚠ Run B: min 4 in')).toBeInTheDocument();
    expect(map.querySelectorAll('[data-tie]').length).toBe(0);
    await user.click(screen.getByRole('switch', { name: 'Show taped ties on the map' }));
    expect(map.querySelectorAll('[data-tie]').length).toBe(1);
    const measure = screen.getByRole('region', { name: 'Measure from' });
    expect(within(measure).getByText('House corner NE')).toBeInTheDocument();
    expect(within(measure).getByText(/10 ft 10 in to Speaker L|10′ 10″ to Speaker L|to Speaker L/)).toBeInTheDocument();
  }, 60_000);

  it('should say there are no ties when none were taped (no switch, no list)', async () => {
    mockApi({ 'GET /api/locate/tok': () => jsonResponse(buildLocateView('tok')) });
    renderLocate('tok');
    expect(await screen.findByText('No taped ties were recorded at this site.', {}, { timeout: 15_000 })).toBeInTheDocument();
    expect(screen.queryByRole('switch')).not.toBeInTheDocument();
    expect(screen.queryByRole('region', { name: 'Measure from' })).not.toBeInTheDocument();
    // No GPS origin: the KML button is there, disabled, and says why.
    expect(screen.getByRole('button', { name: 'Download KML' })).toBeDisabled();
    expect(screen.getByText(/No KML or GeoJSON: this site has no GPS origin/)).toBeInTheDocument();
    // … and no "Show my position", with the reason on one line; the locate sheet is there either way.
    expect(screen.queryByRole('button', { name: 'Show my position' })).not.toBeInTheDocument();
    expect(screen.getByTestId('no-position-reason')).toHaveTextContent(/this site has no GPS origin/);
    expect(screen.getByRole('link', { name: /Print locate sheet/ })).toHaveAttribute('href', '/api/locate/tok/sheet.pdf');
  }, 60_000);

  it('should draw the phone’s position with its accuracy when the site has an origin, and explain a refusal', async () => {
    const view = buildLocateView('tok');
    view.map.frame = { northAzimuthDeg: 0, origin: { lat: 40, lon: -105 } };
    mockApi({ 'GET /api/locate/tok': () => jsonResponse(view) });
    type Watch = (ok: PositionCallback, fail: PositionErrorCallback, options: PositionOptions) => number;
    const watchPosition = vi.fn<Watch>((ok) => {
      // About 1.1 m north and 0.85 m east of the origin (0.00001° of latitude ≈ 1.11 m there).
      ok({ coords: { latitude: 40.00001, longitude: -104.99999, accuracy: 4 } } as GeolocationPosition);
      return 7;
    });
    const clearWatch = vi.fn();
    Object.defineProperty(navigator, 'geolocation', { value: { watchPosition, clearWatch }, configurable: true });
    const { user } = renderLocate('tok');
    await user.click(await screen.findByRole('button', { name: 'Show my position' }, { timeout: 15_000 }));
    expect(watchPosition.mock.calls[0]![2]).toMatchObject({ enableHighAccuracy: true });
    const map = await screen.findByRole('img', { name: /Site plan/ });
    expect(map.querySelector('[data-role="my-position"] [data-role="dot"]')).not.toBeNull();
    expect(screen.getByText('Your phone puts you within about 13 ft 1 in of the black dot.')).toBeInTheDocument();
    expect(screen.getByText(/never in place of the taped ties/)).toBeInTheDocument();
    await user.click(screen.getByRole('button', { name: 'Hide my position' }));
    expect(clearWatch).toHaveBeenCalledWith(7);
    expect(map.querySelector('[data-role="my-position"]')).toBeNull();

    watchPosition.mockImplementation((_ok, fail) => {
      fail({ code: 1, message: 'denied', PERMISSION_DENIED: 1, POSITION_UNAVAILABLE: 2, TIMEOUT: 3 } as GeolocationPositionError);
      return 8;
    });
    await user.click(screen.getByRole('button', { name: 'Show my position' }));
    expect(screen.getByText(/Location permission was refused/)).toBeInTheDocument();
    expect(map.querySelector('[data-role="my-position"]')).toBeNull();
    Object.defineProperty(navigator, 'geolocation', { value: undefined, configurable: true });
  }, 60_000);

  it('should share the link with the share sheet, and copy it where there is none', async () => {
    mockApi({ 'GET /api/locate/tok': () => jsonResponse(buildLocateView('tok')) });
    const { user } = renderLocate('tok');
    const button = await screen.findByRole('button', { name: 'Share this map' }, { timeout: 15_000 });
    const writeText = vi.fn(async () => undefined);
    Object.defineProperty(navigator, 'clipboard', { value: { writeText }, configurable: true });
    Object.defineProperty(navigator, 'share', { value: undefined, configurable: true });
    await user.click(button);
    expect(writeText).toHaveBeenCalledWith(expect.stringMatching(/\/locate\/tok$/));
    expect(await screen.findByText('Link copied: paste it in a message to whoever is digging.')).toBeInTheDocument();

    const share = vi.fn(async () => undefined);
    Object.defineProperty(navigator, 'share', { value: share, configurable: true });
    await user.click(button);
    expect(share).toHaveBeenCalledWith(expect.objectContaining({ title: 'Wrenfold Close', url: expect.stringMatching(/\/locate\/tok$/) }));
    expect(await screen.findByText('Link shared.')).toBeInTheDocument();
    Object.defineProperty(navigator, 'share', { value: undefined, configurable: true });
  }, 60_000);

  it('should show only a clear page for a link that no longer works', async () => {
    mockApi({ 'GET /api/locate/gone': () => apiErrorResponse(404, { message: 'Not valid.', code: 'LOCATE_LINK_NOT_VALID' }) });

    renderLocate('gone');

    expect(await screen.findByRole('heading', { name: 'This link no longer works' })).toBeInTheDocument();
    expect(screen.getByText(/Ask the homeowner for a new one/)).toBeInTheDocument();
    expect(screen.queryByText(/Before you dig/)).not.toBeInTheDocument();
    expect(screen.queryByRole('img')).not.toBeInTheDocument();
  });

  it('should ask to wait when rate-limited', async () => {
    const fetchMock = mockApi({ 'GET /api/locate/busy': () => apiErrorResponse(429, { message: 'Too many requests.' }) });

    renderLocate('busy', [0, 0]);

    expect(await screen.findByRole('heading', { name: 'Too many tries, wait a minute' })).toBeInTheDocument();
    expect(fetchMock.mock.calls.filter(([url]) => String(url) === '/api/locate/busy')).toHaveLength(1);
  });

  it('should try a failed request twice more, then say the map could not be loaded', async () => {
    const fetchMock = mockApi({ 'GET /api/locate/down': () => apiErrorResponse(503, { message: 'Database unavailable.', code: 'DATABASE_UNAVAILABLE' }) });

    renderLocate('down', [0, 0]);

    expect(await screen.findByRole('heading', { name: 'The map could not be loaded' })).toBeInTheDocument();
    expect(fetchMock.mock.calls.filter(([url]) => String(url) === '/api/locate/down')).toHaveLength(3);
  });

  it('should show the loading frame until the answer comes', async () => {
    let answer: (response: Response) => void = () => undefined;
    mockApi({ 'GET /api/locate/slow': () => new Promise<Response>((resolve) => (answer = resolve)) });

    renderLocate('slow');

    expect(screen.getByRole('progressbar', { name: 'Loading the map…' })).toBeInTheDocument();
    expect(screen.getByText('Buried cables')).toBeInTheDocument();
    answer(jsonResponse(buildLocateView('slow')));
    expect(await screen.findByRole('heading', { name: 'Before you dig' })).toBeInTheDocument();
    expect(screen.queryByRole('progressbar')).not.toBeInTheDocument();
  });

  it('should draw an answer that came before the first render at once, with no loading frame', () => {
    const view = buildLocateView('early');
    window.history.replaceState(null, '', '/locate/early');
    render(<LocatePage view={Promise.resolve(view)} initial={{ status: 'ready', view }} />);
    expect(screen.getByRole('heading', { name: 'Before you dig' })).toBeInTheDocument();
    expect(screen.getByText('Buried cables · Garden Sound Co')).toBeInTheDocument();
    expect(screen.queryByRole('progressbar')).not.toBeInTheDocument();
  });
});
