import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import type { AsBuilt } from '@domain/as-built/as-built.schema';
import type { PlanPoint } from '@domain/as-built/common.schema';

import { buildSessionUser } from '../../../testing/data';
import { buildAsBuilt, buildJobAsBuilt, JOB_IDS } from '../../../testing/job-data';
import { mockApi, type MockRequest } from '../../../testing/mock-api';
import { jsonResponse, renderApp } from '../../../testing/render-app';
import { buildSite } from '../../../testing/site-data';

const PLAN_URL = `/jobs/${JOB_IDS.job}/plan`;
const RUN_PUT = `PUT /api/jobs/${JOB_IDS.job}/runs/${JOB_IDS.run}`;
const ORIGIN = { lat: 45, lon: -93 };
/**
 * 1e-4° of latitude north of the origin. WGS 84 (NGA TR8350.2: a = 6 378 137 m, e² = 0.00669437999014):
 * the meridional radius of curvature at 45° is a(1−e²)/(1−e²·sin²45°)^1.5 = 6 367 381.8 m, so the fix
 * lies 11.113 m north of the origin: plan (0, 11.113) on a plan drawn north-up.
 */
const FIX = { latitude: 45.0001, longitude: -93, accuracy: 4 };
const FIX_ON_PLAN = { x: 0, y: 11.113 };

/** The amplifier at the plan origin and the satellite 10 m east; the site has a GPS origin unless told not to. */
function placedAsBuilt({ withOrigin = true, route }: { withOrigin?: boolean; route?: PlanPoint[] } = {}): AsBuilt {
  const asBuilt = buildAsBuilt();
  asBuilt.items = asBuilt.items.map((item) =>
    item.id === JOB_IDS.amp ? { ...item, position: { x: 0, y: 0, source: 'manual' } } : { ...item, position: { x: 10, y: 0, source: 'manual' } },
  );
  if (route) asBuilt.runs = asBuilt.runs.map((run) => ({ ...run, route }));
  if (withOrigin) asBuilt.site = { origin: ORIGIN, northAzimuthDeg: 0 };
  return asBuilt;
}

function mockGeolocation(answer: (done: PositionCallback, fail: PositionErrorCallback) => void) {
  const getCurrentPosition = vi.fn(answer);
  Object.defineProperty(navigator, 'geolocation', { value: { getCurrentPosition }, configurable: true });
  return getCurrentPosition;
}

function tapPlanAt(p: PlanPoint) {
  const svg = screen.getByRole('application');
  const [k, x, y] = (svg.getAttribute('data-transform') ?? '1 0 0').split(' ').map(Number) as [number, number, number];
  fireEvent.click(svg, { clientX: x + k * p.x, clientY: y - k * p.y });
}

async function openRouteTool(user: ReturnType<typeof renderApp>['user']) {
  const toolbar = await screen.findByRole('toolbar', { name: 'Plan tools' }, { timeout: 10_000 });
  await waitFor(() => expect(screen.getByRole('application').getAttribute('data-transform')).not.toBe('1 0 0'));
  await user.click(within(toolbar).getByRole('radio', { name: 'Draw a run route' }));
  await user.selectOptions(screen.getByRole('combobox', { name: 'Run' }), JOB_IDS.run);
}

describe('route tool: Use my position on a bend (issue 17)', () => {
  beforeEach(() => {
    localStorage.clear();
    localStorage.setItem('loamline.units', JSON.stringify({ length: 'metric', gauge: 'awg' }));
  });
  afterEach(() => {
    Object.defineProperty(navigator, 'geolocation', { value: undefined, configurable: true });
  });

  it('should add the next bend at the phone position, say its accuracy and that it is weaker than ties, and save it', async () => {
    const puts: MockRequest[] = [];
    mockApi({
      [`GET /api/jobs/${JOB_IDS.job}/as-built`]: () => jsonResponse(buildJobAsBuilt(placedAsBuilt())),
      [`GET /api/sites/${JOB_IDS.site}`]: () => jsonResponse(buildSite({ origin: ORIGIN })),
      [RUN_PUT]: (request) => {
        puts.push(request);
        return jsonResponse({ run: { ...(request.body as object), id: JOB_IDS.run }, jobVersion: 4 });
      },
    });
    const getCurrentPosition = mockGeolocation((done) => done({ coords: FIX } as unknown as GeolocationPosition));
    const { user } = renderApp({ url: PLAN_URL, signedInAs: buildSessionUser('lead') });
    await openRouteTool(user);

    tapPlanAt({ x: 0, y: 0 });
    await waitFor(() => expect(screen.getByTestId('draft-route')).toHaveAttribute('data-points', '1'));
    await user.click(screen.getByRole('button', { name: 'Add a point at my position' }));
    await waitFor(() => expect(screen.getByTestId('draft-route')).toHaveAttribute('data-points', '2'));
    expect(getCurrentPosition).toHaveBeenCalledWith(expect.any(Function), expect.any(Function), expect.objectContaining({ enableHighAccuracy: true, maximumAge: 0 }));
    expect(screen.getByText(/^Point 2 is your phone’s position, good to about ±4(\.0+)? m\. A phone fix is several times weaker than taped ties/)).toBeInTheDocument();

    tapPlanAt({ x: 10, y: 0 });
    await waitFor(() => expect(screen.getByTestId('draft-route')).toHaveAttribute('data-points', '3'));
    await user.click(screen.getByRole('button', { name: 'Finish route' }));
    await waitFor(() => expect(puts).toHaveLength(1));
    const route = (puts[0]!.body as { route: PlanPoint[] }).route;
    expect(route).toHaveLength(3);
    expect(route[0]).toEqual({ x: 0, y: 0 });
    expect(route[1]!.x).toBeCloseTo(FIX_ON_PLAN.x, 2);
    expect(route[1]!.y).toBeCloseTo(FIX_ON_PLAN.y, 2);
    expect(route[2]).toEqual({ x: 10, y: 0 });
  }, 30_000);

  it('should move the picked bend of a drawn route to the phone position, and only once a bend is picked', async () => {
    const puts: MockRequest[] = [];
    mockApi({
      [`GET /api/jobs/${JOB_IDS.job}/as-built`]: () => jsonResponse(buildJobAsBuilt(placedAsBuilt({ route: [{ x: 0, y: 0 }, { x: 4, y: 4 }, { x: 10, y: 0 }] }))),
      [`GET /api/sites/${JOB_IDS.site}`]: () => jsonResponse(buildSite({ origin: ORIGIN })),
      [RUN_PUT]: (request) => {
        puts.push(request);
        return jsonResponse({ run: { ...(request.body as object), id: JOB_IDS.run }, jobVersion: 4 });
      },
    });
    mockGeolocation((done) => done({ coords: FIX } as unknown as GeolocationPosition));
    const { user, container } = renderApp({ url: PLAN_URL, signedInAs: buildSessionUser('lead') });
    await openRouteTool(user);
    expect(screen.getByTestId('plan-hint')).toHaveTextContent('or for your phone position');

    const move = screen.getByRole('button', { name: 'Move the picked point to my position' });
    expect(move).toBeDisabled();
    fireEvent.click(container.querySelector('[data-hit="vertex"][data-index="1"] circle')!);
    await waitFor(() => expect(move).toBeEnabled());
    await user.click(move);
    await screen.findByText(/^Point 2 is your phone’s position/);
    expect(screen.getByTestId('draft-route')).toHaveAttribute('data-points', '3');

    await user.click(screen.getByRole('button', { name: 'Save route' }));
    await waitFor(() => expect(puts).toHaveLength(1));
    const route = (puts[0]!.body as { route: PlanPoint[] }).route;
    expect(route[0]).toEqual({ x: 0, y: 0 });
    expect(route[1]!.x).toBeCloseTo(FIX_ON_PLAN.x, 2);
    expect(route[1]!.y).toBeCloseTo(FIX_ON_PLAN.y, 2);
    expect(route[2]).toEqual({ x: 10, y: 0 });
  }, 30_000);

  it('should say why when the phone refuses its position, and add nothing', async () => {
    mockApi({
      [`GET /api/jobs/${JOB_IDS.job}/as-built`]: () => jsonResponse(buildJobAsBuilt(placedAsBuilt())),
      [`GET /api/sites/${JOB_IDS.site}`]: () => jsonResponse(buildSite({ origin: ORIGIN })),
    });
    mockGeolocation((_done, fail) => fail({ code: 1, message: 'denied' } as GeolocationPositionError));
    const { user } = renderApp({ url: PLAN_URL, signedInAs: buildSessionUser('lead') });
    await openRouteTool(user);
    await user.click(screen.getByRole('button', { name: 'Add a point at my position' }));
    expect(await screen.findByRole('alert')).toHaveTextContent(/Location permission was refused/);
    expect(screen.getByTestId('draft-route')).toHaveAttribute('data-points', '0');
  }, 30_000);

  it('should not offer the phone position where the site has no GPS origin', async () => {
    mockApi({
      [`GET /api/jobs/${JOB_IDS.job}/as-built`]: () => jsonResponse(buildJobAsBuilt(placedAsBuilt({ withOrigin: false }))),
      [`GET /api/sites/${JOB_IDS.site}`]: () => jsonResponse(buildSite()),
    });
    const { user } = renderApp({ url: PLAN_URL, signedInAs: buildSessionUser('lead') });
    await openRouteTool(user);
    expect(screen.queryByRole('button', { name: /my position/ })).not.toBeInTheDocument();
    expect(screen.getByTestId('plan-hint')).not.toHaveTextContent('phone');
  }, 30_000);
});
