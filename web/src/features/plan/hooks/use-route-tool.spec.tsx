import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import type { AsBuilt } from '@domain/as-built/as-built.schema';
import type { PlanPoint } from '@domain/as-built/common.schema';
import type { RoutePoint } from '@domain/as-built/run.schema';

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
function placedAsBuilt({ withOrigin = true, route }: { withOrigin?: boolean; route?: RoutePoint[] } = {}): AsBuilt {
  const asBuilt = buildAsBuilt();
  asBuilt.items = asBuilt.items.map((item) =>
    item.id === JOB_IDS.amp ? { ...item, position: { x: 0, y: 0, source: 'manual' } } : { ...item, position: { x: 10, y: 0, source: 'manual' } },
  );
  if (route) asBuilt.runs = asBuilt.runs.map((run) => ({ ...run, route }));
  if (withOrigin) asBuilt.site = { origin: ORIGIN, northAzimuthDeg: 0 };
  return asBuilt;
}

/** jsdom has no PointerEvent; a MouseEvent with a pointer id is enough for the drag handlers (as in plan-editor.spec). */
if (typeof window.PointerEvent !== 'function') {
  class TestPointerEvent extends MouseEvent {
    readonly pointerId: number;
    constructor(type: string, init: PointerEventInit = {}) {
      super(type, init);
      this.pointerId = init.pointerId ?? 1;
    }
  }
  Object.defineProperty(window, 'PointerEvent', { writable: true, value: TestPointerEvent });
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
    expect(screen.getByText(/^Point 2 is a phone’s position, good to about ±4(\.0+)? m\. A phone fix is several times weaker than taped ties/)).toBeInTheDocument();
    // On the plan too: a dashed circle of the fix's accuracy around the bend.
    expect(screen.getByRole('graphics-symbol', { name: /^Route point 2 of .*: a phone GPS fix, good to about ±4/ })).toBeInTheDocument();

    tapPlanAt({ x: 10, y: 0 });
    await waitFor(() => expect(screen.getByTestId('draft-route')).toHaveAttribute('data-points', '3'));
    await user.click(screen.getByRole('button', { name: 'Finish route' }));
    await waitFor(() => expect(puts).toHaveLength(1));
    const route = (puts[0]!.body as { route: RoutePoint[] }).route;
    expect(route).toHaveLength(3);
    expect(route[0]).toEqual({ x: 0, y: 0 });
    expect(route[1]!.x).toBeCloseTo(FIX_ON_PLAN.x, 2);
    expect(route[1]!.y).toBeCloseTo(FIX_ON_PLAN.y, 2);
    // Stored as a GPS bend with the fix's accuracy, so the record says it is weaker than a taped one.
    expect(route[1]).toMatchObject({ source: 'gps', accuracyM: 4 });
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
    await screen.findByText(/^Point 2 is a phone’s position/);
    expect(screen.getByTestId('draft-route')).toHaveAttribute('data-points', '3');

    await user.click(screen.getByRole('button', { name: 'Save route' }));
    await waitFor(() => expect(puts).toHaveLength(1));
    const route = (puts[0]!.body as { route: RoutePoint[] }).route;
    expect(route[0]).toEqual({ x: 0, y: 0 });
    expect(route[1]!.x).toBeCloseTo(FIX_ON_PLAN.x, 2);
    expect(route[1]!.y).toBeCloseTo(FIX_ON_PLAN.y, 2);
    expect(route[1]).toMatchObject({ source: 'gps', accuracyM: 4 });
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

  it('should mark a saved GPS bend on the plan and on the run’s card, and drop the source when the bend is dragged off the fix', async () => {
    const puts: MockRequest[] = [];
    const route: RoutePoint[] = [{ x: 0, y: 0 }, { x: 4, y: 4, source: 'gps', accuracyM: 6 }, { x: 10, y: 0 }];
    mockApi({
      [`GET /api/jobs/${JOB_IDS.job}/as-built`]: () => jsonResponse(buildJobAsBuilt(placedAsBuilt({ withOrigin: false, route }))),
      [`GET /api/sites/${JOB_IDS.site}`]: () => jsonResponse(buildSite()),
      [RUN_PUT]: (request) => {
        puts.push(request);
        return jsonResponse({ run: { ...(request.body as object), id: JOB_IDS.run }, jobVersion: 4 });
      },
    });
    const { user, container } = renderApp({ url: PLAN_URL, signedInAs: buildSessionUser('lead') });
    await screen.findByRole('toolbar', { name: 'Plan tools' }, { timeout: 10_000 });
    expect(await screen.findByRole('graphics-symbol', { name: /^Route point 2 of .*: a phone GPS fix, good to about ±6 m/ })).toBeInTheDocument();
    fireEvent.click(container.querySelector(`[data-hit="run"][data-id="${JOB_IDS.run}"]`)!);
    const card = await screen.findByRole('region', { name: /^Run / });
    expect(within(card).getByText('Route point 2 by GPS, ±6 m')).toBeInTheDocument();

    await openRouteTool(user);
    expect(screen.getByText(/^Point 2 is a phone’s position, good to about ±6 m\./)).toBeInTheDocument();
    const vertex = container.querySelector('[data-hit="vertex"][data-index="1"] circle')!;
    fireEvent.pointerDown(vertex, { clientX: 0, clientY: 0, pointerId: 1, button: 0 });
    fireEvent.pointerMove(vertex, { clientX: 15, clientY: 15, pointerId: 1 });
    fireEvent.pointerMove(vertex, { clientX: 30, clientY: 30, pointerId: 1 });
    fireEvent.pointerUp(vertex, { clientX: 30, clientY: 30, pointerId: 1 });
    fireEvent.click(vertex, { clientX: 30, clientY: 30 });
    await waitFor(() => expect(screen.queryByText(/^Point 2 is a phone’s position/)).not.toBeInTheDocument());
    await user.click(screen.getByRole('button', { name: 'Save route' }));
    await waitFor(() => expect(puts).toHaveLength(1));
    const sent = (puts[0]!.body as { route: RoutePoint[] }).route;
    expect(sent[1]).not.toHaveProperty('source');
    expect(sent[1]).not.toHaveProperty('accuracyM');
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
