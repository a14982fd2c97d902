import { act, fireEvent, screen, waitFor, within } from '@testing-library/react';
import { beforeEach, describe, expect, it } from 'vitest';
import type { AsBuilt } from '@domain/as-built/as-built.schema';
import type { PlanPoint } from '@domain/as-built/common.schema';

import { buildSessionUser } from '../../../testing/data';
import { buildAsBuilt, buildJobAsBuilt, JOB_IDS } from '../../../testing/job-data';
import { apiErrorResponse, mockApi, type MockRequest } from '../../../testing/mock-api';
import { jsonResponse, renderApp } from '../../../testing/render-app';
import { buildSite } from '../../../testing/site-data';

const PLAN_URL = `/jobs/${JOB_IDS.job}/plan`;
const AS_BUILT = `GET /api/jobs/${JOB_IDS.job}/as-built`;
const SITE = `GET /api/sites/${JOB_IDS.site}`;
const CREATE = `POST /api/sites/${JOB_IDS.site}/reference-points`;
const SERVER_POINT = '7d1e2f30-1111-4a4a-9b9b-0000000000c3';

/** The amplifier at the plan origin and the satellite 10 m east, both placed by hand. */
function placedAsBuilt(): AsBuilt {
  const asBuilt = buildAsBuilt();
  asBuilt.items = asBuilt.items.map((item) =>
    item.id === JOB_IDS.amp ? { ...item, position: { x: 0, y: 0, source: 'manual' } } : { ...item, position: { x: 10, y: 0, source: 'manual' } },
  );
  return asBuilt;
}

function tapPlanAt(p: PlanPoint) {
  const svg = screen.getByRole('application');
  const [k, x, y] = (svg.getAttribute('data-transform') ?? '1 0 0').split(' ').map(Number) as [number, number, number];
  fireEvent.click(svg, { clientX: x + k * p.x, clientY: y - k * p.y });
}

/** Opens the plan as the crew lead, picks the reference tool and taps (4, 3) on the plan. */
async function tapNewPoint(user: ReturnType<typeof renderApp>['user']) {
  const toolbar = await screen.findByRole('toolbar', { name: 'Plan tools' }, { timeout: 10_000 });
  await waitFor(() => expect(screen.getByRole('application').getAttribute('data-transform')).not.toBe('1 0 0'));
  await user.click(within(toolbar).getByRole('radio', { name: 'Add a reference point' }));
  tapPlanAt({ x: 4, y: 3 });
  return within(await screen.findByRole('dialog', { name: 'New reference point' }));
}

/** What the API answers: the point under its id, the site's new version and the jobs it bumped. */
function created(request: MockRequest) {
  return jsonResponse({ ...(request.body as object), id: SERVER_POINT, notes: null, siteVersion: 2, jobVersions: { [JOB_IDS.job]: 4 } }, 201);
}

describe('ReferencePointDialog on the plan (issue 17)', () => {
  beforeEach(() => {
    localStorage.setItem('loamline.units', JSON.stringify({ length: 'metric', gauge: 'awg' }));
  });

  it('should ask for a name, then add the point to the site on its version, where it was tapped', async () => {
    const posts: MockRequest[] = [];
    mockApi({
      [AS_BUILT]: () => jsonResponse(buildJobAsBuilt(placedAsBuilt())),
      [SITE]: () => jsonResponse(buildSite()),
      [CREATE]: (request) => {
        posts.push(request);
        return created(request);
      },
    });
    const { user } = renderApp({ url: PLAN_URL, signedInAs: buildSessionUser('lead') });
    const dialog = await tapNewPoint(user);
    expect(dialog.getByText(/^At x 4(\.0+)? m, y 3(\.0+)? m on the plan/)).toBeInTheDocument();

    await user.click(dialog.getByRole('button', { name: 'Add point' }));
    expect(await dialog.findByText(/Give the point a name/)).toBeInTheDocument();
    expect(posts).toHaveLength(0);

    await user.type(dialog.getByRole('textbox', { name: /Name/ }), '  Gate post ');
    await user.click(dialog.getByRole('button', { name: 'Add point' }));
    await waitFor(() => expect(posts).toHaveLength(1));
    expect(posts[0]!.body).toEqual({ label: 'Gate post', x: 4, y: 3 });
    expect(posts[0]!.headers.get('If-Match')).toBe('"1"');
    expect(posts[0]!.headers.get('Idempotency-Key')).toEqual(expect.any(String));
    await waitFor(() => expect(screen.queryByRole('dialog', { name: 'New reference point' })).not.toBeInTheDocument());
  }, 30_000);

  it('should show what the server refused under the field and keep the dialog open', async () => {
    mockApi({
      [AS_BUILT]: () => jsonResponse(buildJobAsBuilt(placedAsBuilt())),
      [SITE]: () => jsonResponse(buildSite()),
      [CREATE]: () => apiErrorResponse(400, { message: 'Invalid input', issues: [{ path: 'label', message: 'that name is taken on this site' }] }),
    });
    const { user } = renderApp({ url: PLAN_URL, signedInAs: buildSessionUser('lead') });
    const dialog = await tapNewPoint(user);
    await user.type(dialog.getByRole('textbox', { name: /Name/ }), 'Gate post');
    await user.click(dialog.getByRole('button', { name: 'Add point' }));
    expect(await dialog.findByText(/That name is taken on this site/i)).toBeInTheDocument();
    expect(screen.getByRole('dialog', { name: 'New reference point' })).toBeInTheDocument();
  }, 30_000);

  it('should keep the point on the device with no signal, show it on the plan, and send it once when the signal returns', async () => {
    const posts: MockRequest[] = [];
    let isOnline = false;
    mockApi({
      [AS_BUILT]: () => jsonResponse(buildJobAsBuilt(placedAsBuilt())),
      [SITE]: () => jsonResponse(buildSite()),
      [CREATE]: (request) => {
        if (!isOnline) throw new TypeError('Failed to fetch');
        posts.push(request);
        return created(request);
      },
    });
    const { user } = renderApp({ url: PLAN_URL, signedInAs: buildSessionUser('lead') });
    const dialog = await tapNewPoint(user);
    await user.type(dialog.getByRole('textbox', { name: /Name/ }), 'Gate post');
    await user.click(dialog.getByRole('button', { name: 'Add point' }));

    await waitFor(() => expect(screen.queryByRole('dialog', { name: 'New reference point' })).not.toBeInTheDocument());
    expect((await screen.findAllByText(/Waiting to send \(1\)/)).length).toBeGreaterThan(0);
    // On the plan at once, under this device's id, so ties can be taped from it with no signal.
    expect(await screen.findByRole('graphics-symbol', { name: 'Reference point Gate post' })).toBeInTheDocument();
    expect(posts).toHaveLength(0);

    isOnline = true;
    act(() => void window.dispatchEvent(new Event('online')));
    await waitFor(() => expect(posts).toHaveLength(1), { timeout: 10_000 });
    expect(posts[0]!.body).toEqual({ label: 'Gate post', x: 4, y: 3 });
    await waitFor(() => expect(screen.queryByText(/Waiting to send/)).not.toBeInTheDocument());
    expect(posts).toHaveLength(1);
  }, 30_000);
});
