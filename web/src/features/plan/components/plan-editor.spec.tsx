import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import { beforeEach, describe, expect, it, vi } from 'vitest';
import type { AsBuilt } from '@domain/as-built/as-built.schema';
import type { PlanPoint } from '@domain/as-built/common.schema';

import { buildSessionUser } from '../../../testing/data';
import { buildAsBuilt, buildJobAsBuilt, JOB_IDS } from '../../../testing/job-data';
import { mockApi, type MockRequest } from '../../../testing/mock-api';
import { jsonResponse, renderApp } from '../../../testing/render-app';
import { buildSite } from '../../../testing/site-data';

const PLAN_URL = `/jobs/${JOB_IDS.job}/plan`;
const AS_BUILT = `GET /api/jobs/${JOB_IDS.job}/as-built`;
const SITE = `GET /api/sites/${JOB_IDS.site}`;
const IMAGE_URL = `/api/sites/${JOB_IDS.site}/plan-image`;
const REF_A = '7d1e2f30-1111-4a4a-9b9b-0000000000a1';
const REF_B = '7d1e2f30-1111-4a4a-9b9b-0000000000a2';
const NOW = '2026-04-21T15:30:00.000Z';

/** The amplifier at the plan origin and the satellite 10 m east, both placed by hand. */
function placedAsBuilt(): AsBuilt {
  const asBuilt = buildAsBuilt();
  asBuilt.items = asBuilt.items.map((item) =>
    item.id === JOB_IDS.amp ? { ...item, position: { x: 0, y: 0, source: 'manual' } } : { ...item, position: { x: 10, y: 0, source: 'manual' } },
  );
  return asBuilt;
}

/** Taps the plan at plan point `p`, through the zoom the canvas reports (jsdom lays the SVG out at 0, 0). */
function tapPlanAt(p: PlanPoint) {
  const svg = screen.getByRole('application');
  const [k, x, y] = (svg.getAttribute('data-transform') ?? '1 0 0').split(' ').map(Number) as [number, number, number];
  fireEvent.click(svg, { clientX: x + k * p.x, clientY: y - k * p.y });
}

/** Waits until the plan has been fitted to its content (the zoom is no longer the starting identity). */
async function waitForFit() {
  await waitFor(() => expect(screen.getByRole('application').getAttribute('data-transform')).not.toBe('1 0 0'));
}

async function chooseTool(user: ReturnType<typeof renderApp>['user'], name: string) {
  const toolbar = await screen.findByRole('toolbar', { name: 'Plan tools' }, { timeout: 10_000 });
  await waitForFit();
  await user.click(within(toolbar).getByRole('radio', { name }));
}

/** jsdom has no PointerEvent; a MouseEvent with a pointer id is enough for the drag handlers. */
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

/** A finger or mouse drag from one screen point to another on `element`. */
function drag(element: Element, from: { x: number; y: number }, to: { x: number; y: number }) {
  fireEvent.pointerDown(element, { clientX: from.x, clientY: from.y, pointerId: 7, button: 0 });
  fireEvent.pointerMove(element, { clientX: (from.x + to.x) / 2, clientY: (from.y + to.y) / 2, pointerId: 7 });
  fireEvent.pointerMove(element, { clientX: to.x, clientY: to.y, pointerId: 7 });
  fireEvent.pointerUp(element, { clientX: to.x, clientY: to.y, pointerId: 7 });
  fireEvent.click(element, { clientX: to.x, clientY: to.y });
}

function screenAt(p: PlanPoint): { x: number; y: number } {
  const [k, x, y] = screen.getByRole('application').getAttribute('data-transform')!.split(' ').map(Number) as [number, number, number];
  return { x: x + k * p.x, y: y - k * p.y };
}

describe('PlanEditor', () => {
  beforeEach(() => {
    localStorage.clear();
    localStorage.setItem('loamline.units', JSON.stringify({ length: 'metric', gauge: 'awg' }));
  });

  it('should add a route point per tap, undo the last one and send the route with If-Match on finish', async () => {
    const puts: MockRequest[] = [];
    mockApi({
      [AS_BUILT]: () => jsonResponse(buildJobAsBuilt(placedAsBuilt())),
      [SITE]: () => jsonResponse(buildSite()),
      [`PUT /api/jobs/${JOB_IDS.job}/runs/${JOB_IDS.run}`]: (request) => {
        puts.push(request);
        return jsonResponse({ run: { ...(request.body as object), id: JOB_IDS.run }, jobVersion: 4 });
      },
    });
    const { user } = renderApp({ url: PLAN_URL, signedInAs: buildSessionUser('lead') });
    await chooseTool(user, 'Draw a run route');
    await user.selectOptions(screen.getByRole('combobox', { name: 'Run' }), JOB_IDS.run);
    expect(screen.getByTestId('plan-hint')).toHaveTextContent('Tap where the trench starts, at Garage amp.');

    // The first tap lands a little off the amplifier and snaps onto it; the last snaps onto the satellite.
    tapPlanAt({ x: 0.1, y: -0.1 });
    tapPlanAt({ x: 4, y: 6 });
    tapPlanAt({ x: 7, y: 9 });
    await waitFor(() => expect(screen.getByTestId('draft-route')).toHaveAttribute('data-points', '3'));
    expect(screen.getByTestId('plan-hint')).toHaveTextContent('Point 4.');
    await user.click(screen.getByRole('button', { name: 'Undo last point' }));
    expect(screen.getByTestId('draft-route')).toHaveAttribute('data-points', '2');
    tapPlanAt({ x: 10.05, y: 0.05 });
    await waitFor(() => expect(screen.getByTestId('draft-route')).toHaveAttribute('data-points', '3'));
    expect(screen.getByText(/Not saved yet: the route is kept on this device/)).toBeInTheDocument();

    await user.click(screen.getByRole('button', { name: 'Finish route' }));
    await waitFor(() => expect(puts).toHaveLength(1));
    expect(puts[0]!.headers.get('If-Match')).toBe('"3"');
    const body = puts[0]!.body as Record<string, unknown> & { route: PlanPoint[] };
    expect(body.route).toEqual([
      { x: 0, y: 0 },
      { x: 4, y: 6 },
      { x: 10, y: 0 },
    ]);
    // A replacement of the whole run, without its id, and without readings so the server keeps them.
    expect(body).toMatchObject({ label: 'Patio trunk', fromItemId: JOB_IDS.amp, toItemId: JOB_IDS.speaker, measuredLengthM: 12, method: 'direct_burial' });
    expect(body).not.toHaveProperty('id');
    expect(body).not.toHaveProperty('depthReadings');
  }, 30_000);

  it('should draw a landmark by tapping its corners, snapping onto an item, and send it with the site version', async () => {
    const posts: MockRequest[] = [];
    const asBuilt = placedAsBuilt();
    asBuilt.site = { ...asBuilt.site, features: [{ id: 'f-fence', kind: 'fence', name: 'East fence', shape: 'line', points: [{ x: 14, y: -2 }, { x: 14, y: 8 }] }] };
    mockApi({
      [AS_BUILT]: () => jsonResponse(buildJobAsBuilt(asBuilt)),
      [SITE]: () => jsonResponse(buildSite()),
      [`POST /api/sites/${JOB_IDS.site}/features`]: (request) => {
        posts.push(request);
        return jsonResponse({ id: 'f-new', ...(request.body as object), createdAt: NOW, updatedAt: NOW, siteVersion: 9, jobVersions: {} }, 201);
      },
    });
    const { user } = renderApp({ url: PLAN_URL, signedInAs: buildSessionUser('lead') });
    await chooseTool(user, 'Draw landmarks (house, fences, patio …)');
    // The site's landmarks are drawn (grey, under the runs) and listed.
    expect(document.querySelector('[data-feature-id="f-fence"]')).not.toBeNull();
    await user.selectOptions(screen.getByRole('combobox', { name: 'Kind' }), 'patio');
    await user.type(screen.getByRole('textbox', { name: /Name/ }), 'Back patio');
    tapPlanAt({ x: 0.1, y: -0.1 });
    tapPlanAt({ x: 6, y: 0 });
    tapPlanAt({ x: 6, y: 4 });
    await waitFor(() => expect(screen.getByText('3 points')).toBeInTheDocument());
    await user.click(screen.getByRole('button', { name: 'Save landmark' }));
    await waitFor(() => expect(posts).toHaveLength(1));
    expect(posts[0]!.headers.get('If-Match')).toMatch(/^"\d+"$/);
    expect(posts[0]!.body).toEqual({
      kind: 'patio',
      name: 'Back patio',
      shape: 'polygon',
      points: [
        { x: 0, y: 0 },
        { x: 6, y: 0 },
        { x: 6, y: 4 },
      ],
    });
  }, 90_000);

  it('should keep a route being drawn on the device across a reload', async () => {
    mockApi({
      [AS_BUILT]: () => jsonResponse(buildJobAsBuilt(placedAsBuilt())),
      [SITE]: () => jsonResponse(buildSite()),
    });
    const first = renderApp({ url: PLAN_URL, signedInAs: buildSessionUser('lead') });
    await chooseTool(first.user, 'Draw a run route');
    await first.user.selectOptions(screen.getByRole('combobox', { name: 'Run' }), JOB_IDS.run);
    tapPlanAt({ x: 0, y: 0 });
    tapPlanAt({ x: 3, y: 5 });
    await waitFor(() => expect(screen.getByTestId('draft-route')).toHaveAttribute('data-points', '2'));
    first.unmount();

    const second = renderApp({ url: PLAN_URL, signedInAs: buildSessionUser('lead') });
    // The banner names the unsaved form and links to it.
    expect(await screen.findByRole('link', { name: /Route on the plan/ }, { timeout: 10_000 })).toBeInTheDocument();
    await chooseTool(second.user, 'Draw a run route');
    await second.user.selectOptions(screen.getByRole('combobox', { name: 'Run' }), JOB_IDS.run);
    expect(screen.getByTestId('draft-route')).toHaveAttribute('data-points', '2');
  }, 30_000);

  it('should change a drawn route: tap its line to add a point, pick a point and delete it, then save', async () => {
    const asBuilt = placedAsBuilt();
    asBuilt.runs = asBuilt.runs.map((run) => ({ ...run, route: [{ x: 0, y: 0 }, { x: 4, y: 4 }, { x: 10, y: 0 }] }));
    const puts: MockRequest[] = [];
    mockApi({
      [AS_BUILT]: () => jsonResponse(buildJobAsBuilt(asBuilt)),
      [SITE]: () => jsonResponse(buildSite()),
      [`PUT /api/jobs/${JOB_IDS.job}/runs/${JOB_IDS.run}`]: (request) => {
        puts.push(request);
        return jsonResponse({ run: { ...(request.body as object), id: JOB_IDS.run }, jobVersion: 4 });
      },
    });
    const { user, container } = renderApp({ url: PLAN_URL, signedInAs: buildSessionUser('lead') });
    await chooseTool(user, 'Draw a run route');
    await user.selectOptions(screen.getByRole('combobox', { name: 'Run' }), JOB_IDS.run);
    expect(screen.getByTestId('plan-hint')).toHaveTextContent('Tap the line to add a point');
    expect(screen.getByRole('button', { name: 'Save route' })).toBeDisabled();

    // A tap on the second segment, halfway between (4, 4) and (10, 0), adds a point there.
    const svg = screen.getByRole('application');
    const [k, x, y] = svg.getAttribute('data-transform')!.split(' ').map(Number) as [number, number, number];
    fireEvent.click(container.querySelector('[data-hit="segment"][data-index="1"]')!, { clientX: x + k * 7, clientY: y - k * 2 });
    await waitFor(() => expect(screen.getByTestId('draft-route')).toHaveAttribute('data-points', '4'));

    // Pick the first bend and delete it.
    fireEvent.click(container.querySelector('[data-hit="vertex"][data-index="1"] circle')!);
    await user.click(screen.getByRole('button', { name: 'Delete point' }));
    await waitFor(() => expect(screen.getByTestId('draft-route')).toHaveAttribute('data-points', '3'));

    await user.click(screen.getByRole('button', { name: 'Save route' }));
    await waitFor(() => expect(puts).toHaveLength(1));
    expect(puts[0]!.headers.get('If-Match')).toBe('"3"');
    expect((puts[0]!.body as { route: PlanPoint[] }).route).toEqual([
      { x: 0, y: 0 },
      { x: 7, y: 2 },
      { x: 10, y: 0 },
    ]);
  }, 30_000);

  it('should calibrate the uploaded image from two taps and a distance and send the pixels and metres', async () => {
    const createObjectURL = vi.fn(() => 'blob:plan-image');
    Object.assign(URL, { createObjectURL, revokeObjectURL: vi.fn() });
    const patches: MockRequest[] = [];
    const site = buildSite({ planImage: { widthPx: 1000, heightPx: 500, contentType: 'image/png', url: IMAGE_URL } });
    mockApi({
      [AS_BUILT]: () => jsonResponse(buildJobAsBuilt(placedAsBuilt())),
      [SITE]: () => jsonResponse(site),
      [`GET ${IMAGE_URL}`]: () => new Response(new Blob([new Uint8Array([137, 80, 78, 71])], { type: 'image/png' }), { status: 200, headers: { 'Content-Type': 'image/png' } }),
      [`PATCH /api/sites/${JOB_IDS.site}`]: (request) => {
        patches.push(request);
        return jsonResponse({ ...site, planCalibration: (request.body as { planCalibration: unknown }).planCalibration, siteVersion: 2, jobVersions: {} });
      },
    });
    const { user } = renderApp({ url: PLAN_URL, signedInAs: buildSessionUser('office') });
    await chooseTool(user, 'Plan image and scale');
    await waitFor(() => expect(screen.getByTestId('plan-image')).toHaveAttribute('href', 'blob:plan-image'));
    expect(screen.getByTestId('plan-hint')).toHaveTextContent('Tap point A on the image');

    // Not yet to scale, the 1000 px wide image is shown 40 m wide with its top-left corner at the plan
    // origin: pixel (100, 400) is at plan (4, −16) and pixel (600, 400) at (24, −16).
    tapPlanAt({ x: 4, y: -16 });
    expect(screen.getByTestId('plan-hint')).toHaveTextContent('Now tap point B');
    tapPlanAt({ x: 24, y: -16 });
    await user.type(screen.getByRole('textbox', { name: /Real distance from A to B/ }), '10');
    await user.click(screen.getByRole('button', { name: 'Save scale' }));

    await waitFor(() => expect(patches).toHaveLength(1));
    expect(patches[0]!.body).toEqual({ planCalibration: { a: { x: 100, y: 400 }, b: { x: 600, y: 400 }, distanceM: 10 } });
  }, 30_000);

  it('should refuse a calibration tap off the image and say why', async () => {
    Object.assign(URL, { createObjectURL: vi.fn(() => 'blob:plan-image'), revokeObjectURL: vi.fn() });
    const site = buildSite({ planImage: { widthPx: 1000, heightPx: 500, contentType: 'image/png', url: IMAGE_URL } });
    mockApi({
      [AS_BUILT]: () => jsonResponse(buildJobAsBuilt(placedAsBuilt())),
      [SITE]: () => jsonResponse(site),
      [`GET ${IMAGE_URL}`]: () => new Response(new Blob([new Uint8Array([1])], { type: 'image/png' }), { status: 200 }),
    });
    const { user } = renderApp({ url: PLAN_URL, signedInAs: buildSessionUser('office') });
    await chooseTool(user, 'Plan image and scale');
    tapPlanAt({ x: -5, y: 5 });
    expect(screen.getByTestId('plan-hint')).toHaveTextContent('That tap was off the image');
  }, 30_000);

  it('should place an item from two ties tapped on the plan, show the solution and save it with its ties', async () => {
    const asBuilt = buildAsBuilt();
    asBuilt.referencePoints = [
      { id: REF_A, label: 'NE house corner', x: 0, y: 0 },
      { id: REF_B, label: 'Gate post', x: 6, y: 0 },
    ];
    const puts: MockRequest[] = [];
    mockApi({
      [AS_BUILT]: () => jsonResponse(buildJobAsBuilt(asBuilt)),
      [SITE]: () => jsonResponse(buildSite()),
      [`PUT /api/jobs/${JOB_IDS.job}/items/${JOB_IDS.speaker}`]: (request) => {
        puts.push(request);
        return jsonResponse({ item: { ...(request.body as object), id: JOB_IDS.speaker }, jobVersion: 4 });
      },
    });
    const { user, container } = renderApp({ url: PLAN_URL, signedInAs: buildSessionUser('lead') });
    await chooseTool(user, 'Place by ties');
    await user.selectOptions(screen.getByRole('combobox', { name: 'Item to place' }), JOB_IDS.speaker);

    // Tapping the two reference points fills the tie rows in order.
    fireEvent.click(container.querySelector(`[data-hit="reference"][data-id="${REF_A}"] circle`)!);
    fireEvent.click(container.querySelector(`[data-hit="reference"][data-id="${REF_B}"] circle`)!);
    expect(screen.getByRole('combobox', { name: 'Tie 1 from' })).toHaveValue(REF_A);
    expect(screen.getByRole('combobox', { name: 'Tie 2 from' })).toHaveValue(REF_B);
    const distances = screen.getAllByRole('textbox', { name: 'Distance' });
    await user.type(distances[0]!, '5');
    await user.type(distances[1]!, '5');
    await user.click(screen.getByRole('radio', { name: 'Left' }));

    // 3-4-5 triangle: 5 m from (0, 0) and from (6, 0), left of the line from the first to the second → (3, 4).
    expect(await screen.findByText(/Placed at x 3 m, y 4 m/)).toBeInTheDocument();
    expect(screen.getByTestId('accuracy-circle')).toBeInTheDocument();
    await user.click(screen.getByRole('button', { name: 'Save position' }));

    await waitFor(() => expect(puts).toHaveLength(1));
    expect(puts[0]!.headers.get('If-Match')).toBe('"3"');
    const body = puts[0]!.body as Record<string, unknown>;
    expect(body).toMatchObject({
      kind: 'speaker',
      label: 'Patio satellite',
      ties: [
        { referencePointId: REF_A, distanceM: 5 },
        { referencePointId: REF_B, distanceM: 5 },
      ],
      sideHint: 'left',
      position: { x: 3, y: 4, source: 'ties' },
    });
    expect((body.position as { accuracyM: number }).accuracyM).toBeGreaterThan(0);
  }, 30_000);

  it('should turn north a step at a time, turn the arrow with it and save the bearing', async () => {
    const patches: MockRequest[] = [];
    const site = buildSite({ northAzimuthDeg: 355 });
    mockApi({
      [AS_BUILT]: () => jsonResponse(buildJobAsBuilt(placedAsBuilt())),
      [SITE]: () => jsonResponse(site),
      [`PATCH /api/sites/${JOB_IDS.site}`]: (request) => {
        patches.push(request);
        return jsonResponse({ ...site, ...(request.body as object) });
      },
    });
    const { user } = renderApp({ url: PLAN_URL, signedInAs: buildSessionUser('office') });
    await chooseTool(user, 'Set north');
    expect(screen.getByTestId('north-arrow')).toHaveAttribute('transform', 'rotate(-355)');
    // 355° + 10° wraps round to 5°.
    await user.click(screen.getByRole('button', { name: "Turn the plan's top 10 degrees clockwise" }));
    expect(screen.getByRole('textbox', { name: /Bearing of the plan/ })).toHaveValue('5');
    expect(screen.getByTestId('north-arrow')).toHaveAttribute('transform', 'rotate(-5)');
    await user.click(screen.getByRole('button', { name: 'Save north' }));
    await waitFor(() => expect(patches).toHaveLength(1));
    expect(patches[0]!.body).toEqual({ northAzimuthDeg: 5 });
  }, 30_000);

  it('should let a crew lead upload the plan image, set its scale and north, as the API does', async () => {
    Object.assign(URL, { createObjectURL: vi.fn(() => 'blob:plan-image'), revokeObjectURL: vi.fn() });
    const site = buildSite({ planImage: { widthPx: 1000, heightPx: 500, contentType: 'image/png', url: IMAGE_URL } });
    mockApi({
      [AS_BUILT]: () => jsonResponse(buildJobAsBuilt(placedAsBuilt())),
      [SITE]: () => jsonResponse(site),
      [`GET ${IMAGE_URL}`]: () => new Response(new Blob([new Uint8Array([1])], { type: 'image/png' }), { status: 200 }),
    });
    const { user } = renderApp({ url: PLAN_URL, signedInAs: buildSessionUser('lead') });
    const toolbar = await screen.findByRole('toolbar', { name: 'Plan tools' }, { timeout: 10_000 });
    expect(within(toolbar).getAllByRole('radio').map((radio) => radio.getAttribute('aria-label'))).toEqual([
      'Select and move',
      'Add a reference point',
      'Draw landmarks (house, fences, patio …)',
      'Draw a run route',
      'Place by ties',
      'Plan image and scale',
      'Set north',
    ]);
    await chooseTool(user, 'Plan image and scale');
    expect(screen.getByTestId('plan-hint')).toHaveTextContent('Tap point A on the image');
    expect(screen.getByRole('button', { name: 'Replace image' })).toBeInTheDocument();
    tapPlanAt({ x: 4, y: -16 });
    expect(await screen.findByText(/Point A: picked/)).toBeInTheDocument();
  }, 30_000);

  it('should move an item placed by hand when it is dragged, and save where it was dropped', async () => {
    const puts: MockRequest[] = [];
    mockApi({
      [AS_BUILT]: () => jsonResponse(buildJobAsBuilt(placedAsBuilt())),
      [SITE]: () => jsonResponse(buildSite()),
      [`PUT /api/jobs/${JOB_IDS.job}/items/${JOB_IDS.speaker}`]: (request) => {
        puts.push(request);
        return jsonResponse({ item: { ...(request.body as object), id: JOB_IDS.speaker }, jobVersion: 4 });
      },
    });
    const { container } = renderApp({ url: PLAN_URL, signedInAs: buildSessionUser('lead') });
    await screen.findByRole('toolbar', { name: 'Plan tools' }, { timeout: 10_000 });
    await waitForFit();
    const speaker = container.querySelector(`[data-hit="item"][data-id="${JOB_IDS.speaker}"] circle`)!;
    drag(speaker, screenAt({ x: 10, y: 0 }), screenAt({ x: 8, y: 3 }));

    await waitFor(() => expect(puts).toHaveLength(1));
    expect(puts[0]!.headers.get('If-Match')).toBe('"3"');
    expect(puts[0]!.body).toMatchObject({ kind: 'speaker', label: 'Patio satellite', position: { x: 8, y: 3, source: 'manual' } });
    // The drop is not also a tap: nothing got selected.
    expect(screen.queryByRole('region', { name: 'Item Patio satellite' })).not.toBeInTheDocument();
  }, 30_000);

  it('should turn the north arrow by dragging it round', async () => {
    const patches: MockRequest[] = [];
    const site = buildSite({ northAzimuthDeg: 0 });
    mockApi({
      [AS_BUILT]: () => jsonResponse(buildJobAsBuilt(placedAsBuilt())),
      [SITE]: () => jsonResponse(site),
      [`PATCH /api/sites/${JOB_IDS.site}`]: (request) => {
        patches.push(request);
        return jsonResponse({ ...site, ...(request.body as object) });
      },
    });
    const { user, container } = renderApp({ url: PLAN_URL, signedInAs: buildSessionUser('office') });
    await chooseTool(user, 'Set north');
    // jsdom lays the plan out 360 px wide, so the arrow's centre is at (326, 40). Dragged to straight
    // right of it, the arrow points at 90° clockwise of up: north is right, so the plan's top faces 270°.
    const arrow = container.querySelector('[data-layer="north-arrow"]')!;
    drag(arrow, { x: 326, y: 10 }, { x: 356, y: 40 });
    expect(screen.getByRole('textbox', { name: /Bearing of the plan/ })).toHaveValue('270');
    expect(screen.getByTestId('north-arrow')).toHaveAttribute('transform', 'rotate(-270)');
    await user.click(screen.getByRole('button', { name: 'Save north' }));
    await waitFor(() => expect(patches).toHaveLength(1));
    expect(patches[0]!.body).toEqual({ northAzimuthDeg: 270 });
  }, 30_000);

  it('should hide and show layers from the layers menu', async () => {
    const asBuilt = placedAsBuilt();
    asBuilt.runs = asBuilt.runs.map((run) => ({ ...run, route: [{ x: 0, y: 0 }, { x: 10, y: 0 }] }));
    mockApi({
      [AS_BUILT]: () => jsonResponse(buildJobAsBuilt(asBuilt)),
      [SITE]: () => jsonResponse(buildSite()),
    });
    const { user, container } = renderApp({ url: PLAN_URL, signedInAs: buildSessionUser('lead') });
    await screen.findByRole('toolbar', { name: 'Plan tools' }, { timeout: 10_000 });
    expect(container.querySelector(`[data-run-id="${JOB_IDS.run}"]`)).not.toBeNull();
    expect(screen.getByText('Garage amp', { selector: 'text' })).toBeInTheDocument();

    await user.click(screen.getByRole('button', { name: 'Layers' }));
    await user.click(await screen.findByRole('menuitemcheckbox', { name: 'Runs' }));
    expect(container.querySelector(`[data-run-id="${JOB_IDS.run}"]`)).toBeNull();
    await user.click(screen.getByRole('menuitemcheckbox', { name: 'Labels' }));
    expect(screen.queryByText('Garage amp', { selector: 'text' })).not.toBeInTheDocument();
    await user.click(screen.getByRole('menuitemcheckbox', { name: 'Runs' }));
    expect(container.querySelector(`[data-run-id="${JOB_IDS.run}"]`)).not.toBeNull();
  }, 30_000);

  it('should offer only looking to a technician, who may not change the plan', async () => {
    mockApi({
      [AS_BUILT]: () => jsonResponse(buildJobAsBuilt(placedAsBuilt())),
      [SITE]: () => jsonResponse(buildSite()),
    });
    renderApp({ url: PLAN_URL, signedInAs: buildSessionUser('tech') });
    const toolbar = await screen.findByRole('toolbar', { name: 'Plan tools' }, { timeout: 10_000 });
    expect(within(toolbar).getAllByRole('radio').map((radio) => radio.getAttribute('aria-label'))).toEqual(['Select and move']);
    expect(screen.getByTestId('plan-hint')).toHaveTextContent('You can look at this plan but not change it.');
  }, 30_000);
});
