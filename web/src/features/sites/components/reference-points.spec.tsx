import { screen, waitFor, within } from '@testing-library/react';
import { beforeEach, describe, expect, it } from 'vitest';
import type { SiteResponse } from '@domain/sites/site.schema';

import { buildSessionUser } from '../../../testing/data';
import { apiErrorResponse, mockApi, type MockRequest } from '../../../testing/mock-api';
import { jsonResponse, renderApp } from '../../../testing/render-app';

const SITE_ID = '7d1e2f30-3333-4a4a-9b9b-000000000002';
const GATE = { id: '7d1e2f30-3333-4a4a-9b9b-000000000041', label: 'Gate post', x: 3, y: -2, notes: null };
const CORNER = { id: '7d1e2f30-3333-4a4a-9b9b-000000000042', label: 'House corner', x: 0, y: 0, notes: null };

function buildSite(referencePoints: SiteResponse['referencePoints'], version = 4): SiteResponse {
  return {
    id: SITE_ID,
    label: 'Thistledown garden',
    customer: { id: '7d1e2f30-3333-4a4a-9b9b-000000000003', name: 'Perrin Ashgrove' },
    addressLine1: '4 Brambleway',
    addressLine2: null,
    city: 'Marrowby',
    region: null,
    postalCode: null,
    country: 'Testland',
    northAzimuthDeg: 0,
    origin: null,
    planImage: null,
    planCalibration: null,
    notes: null,
    referencePoints,
    homeowners: [],
    jobs: [],
    version,
    createdAt: '2026-04-01T09:00:00.000Z',
    updatedAt: '2026-04-01T09:00:00.000Z',
  };
}

async function confirmDialog(title: string) {
  const heading = await screen.findByText(title, { selector: 'h2' }, { timeout: 10_000 });
  return within(heading.closest<HTMLElement>('[role="alertdialog"]')!);
}

describe('ReferencePoints', () => {
  beforeEach(() => localStorage.clear());

  it('should delete a point after confirming and put it back on Undo, each on the site version it has (If-Match)', async () => {
    let site = buildSite([CORNER, GATE], 4);
    const requests: MockRequest[] = [];
    mockApi({
      [`GET /api/sites/${SITE_ID}`]: () => jsonResponse(site),
      [`DELETE /api/sites/${SITE_ID}/reference-points/${GATE.id}`]: (request) => {
        requests.push(request);
        site = buildSite([CORNER], 5);
        return jsonResponse({ siteVersion: 5, jobVersions: {} });
      },
      [`POST /api/sites/${SITE_ID}/reference-points`]: (request) => {
        requests.push(request);
        site = buildSite([CORNER, { ...GATE, id: '7d1e2f30-3333-4a4a-9b9b-000000000043' }], 6);
        return jsonResponse({ ...site.referencePoints[1], siteVersion: 6, jobVersions: {} }, 201);
      },
    });
    const { user } = renderApp({ url: `/sites/${SITE_ID}`, signedInAs: buildSessionUser('lead') });
    await user.click(await screen.findByRole('button', { name: 'Delete Gate post' }, { timeout: 10_000 }));
    const dialog = await confirmDialog('Delete the reference point “Gate post”?');
    await user.click(dialog.getByRole('button', { name: 'Delete', hidden: true }));
    await waitFor(() => expect(requests).toHaveLength(1));
    await waitFor(() => expect(screen.queryByText('Gate post')).not.toBeInTheDocument());

    await user.click(await screen.findByText('Undo', undefined, { timeout: 10_000 }));
    await waitFor(() => expect(requests).toHaveLength(2));
    expect(requests[0]!.headers.get('If-Match')).toBe('"4"');
    expect(requests[1]!.body).toEqual({ label: 'Gate post', x: 3, y: -2 });
    expect(requests[1]!.headers.get('If-Match')).toBe('"5"');
    const list = screen.getByRole('list', { name: 'Reference points' });
    expect(await within(list).findByText('Gate post')).toBeInTheDocument();
  }, 30_000);

  it('should keep the dialog open with the API’s words when ties still use the point', async () => {
    mockApi({
      [`GET /api/sites/${SITE_ID}`]: () => jsonResponse(buildSite([CORNER])),
      [`DELETE /api/sites/${SITE_ID}/reference-points/${CORNER.id}`]: () =>
        apiErrorResponse(409, { message: 'Items are tied to this reference point: change their ties first.', code: 'IN_USE' }),
    });
    const { user } = renderApp({ url: `/sites/${SITE_ID}`, signedInAs: buildSessionUser('office') });
    await user.click(await screen.findByRole('button', { name: 'Delete House corner' }, { timeout: 10_000 }));
    const dialog = await confirmDialog('Delete the reference point “House corner”?');
    await user.click(dialog.getByRole('button', { name: 'Delete', hidden: true }));
    expect(await dialog.findByText('Items are tied to this reference point: change their ties first.')).toBeInTheDocument();
    expect(screen.getByText('House corner', { selector: 'span' })).toBeInTheDocument();
  }, 30_000);

  it('should ask, as job writes do, when someone changed the site first, and save on top of the latest version when kept', async () => {
    let site = buildSite([CORNER, GATE], 4);
    const patches: MockRequest[] = [];
    mockApi({
      [`GET /api/sites/${SITE_ID}`]: () => jsonResponse(site),
      [`PATCH /api/sites/${SITE_ID}/reference-points/${GATE.id}`]: (request) => {
        patches.push(request);
        if (request.headers.get('If-Match') === '"4"') {
          // Someone else moved the corner meanwhile: the site is at version 7 now.
          site = buildSite([{ ...CORNER, x: 0.5 }, GATE], 7);
          return apiErrorResponse(412, { message: 'Someone changed this site after you opened it (it is now at version 7).', code: 'VERSION_CONFLICT', currentVersion: 7 });
        }
        site = buildSite([{ ...CORNER, x: 0.5 }, { ...GATE, label: 'Gate post (west)' }], 8);
        return jsonResponse({ ...GATE, label: 'Gate post (west)', siteVersion: 8, jobVersions: {} });
      },
    });
    const { user } = renderApp({ url: `/sites/${SITE_ID}`, signedInAs: buildSessionUser('office') });
    await user.click(await screen.findByRole('button', { name: 'Change Gate post' }, { timeout: 10_000 }));
    const form = screen.getByRole('form', { name: 'Change Gate post' });
    const name = within(form).getByRole('textbox', { name: /Name/ });
    await user.clear(name);
    await user.type(name, 'Gate post (west)');
    await user.click(within(form).getByRole('button', { name: /Save/ }));

    const heading = await screen.findByText('Someone changed this site first', { selector: 'h2' }, { timeout: 10_000 });
    const dialog = within(heading.closest<HTMLElement>('[role="alertdialog"]')!);
    expect(dialog.getByText(/now at version 7/)).toBeInTheDocument();
    await user.click(dialog.getByRole('button', { name: 'Keep mine and save', hidden: true }));
    await waitFor(() => expect(patches).toHaveLength(2));
    expect(patches.map((p) => p.headers.get('If-Match'))).toEqual(['"4"', '"7"']);
    expect(patches[1]!.body).toEqual(patches[0]!.body);
    const list = screen.getByRole('list', { name: 'Reference points' });
    expect(await within(list).findByText('Gate post (west)', undefined, { timeout: 10_000 })).toBeInTheDocument();
  }, 60_000);

  it('should drop the change when the conflict is answered with Discard mine, sending nothing more', async () => {
    let site = buildSite([CORNER, GATE], 4);
    const patches: MockRequest[] = [];
    mockApi({
      [`GET /api/sites/${SITE_ID}`]: () => jsonResponse(site),
      [`PATCH /api/sites/${SITE_ID}/reference-points/${GATE.id}`]: (request) => {
        patches.push(request);
        site = buildSite([CORNER, GATE], 7);
        return apiErrorResponse(412, { message: 'Someone changed this site after you opened it.', code: 'VERSION_CONFLICT', currentVersion: 7 });
      },
    });
    const { user } = renderApp({ url: `/sites/${SITE_ID}`, signedInAs: buildSessionUser('office') });
    await user.click(await screen.findByRole('button', { name: 'Change Gate post' }, { timeout: 10_000 }));
    const form = screen.getByRole('form', { name: 'Change Gate post' });
    await user.type(within(form).getByRole('textbox', { name: /Name/ }), ' moved');
    await user.click(within(form).getByRole('button', { name: /Save/ }));
    const heading = await screen.findByText('Someone changed this site first', { selector: 'h2' }, { timeout: 10_000 });
    await user.click(within(heading.closest<HTMLElement>('[role="alertdialog"]')!).getByRole('button', { name: 'Discard mine', hidden: true }));
    expect(await screen.findByText('Showing the latest version of the site', undefined, { timeout: 10_000 })).toBeInTheDocument();
    expect(patches).toHaveLength(1);
  }, 60_000);
});
