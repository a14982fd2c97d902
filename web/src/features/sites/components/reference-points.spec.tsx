import { screen, waitFor, within } from '@testing-library/react';
import { beforeEach, describe, expect, it } from 'vitest';
import type { SiteResponse } from '@domain/sites/site.schema';

import { buildSessionUser } from '../../../testing/data';
import { apiErrorResponse, mockApi, type MockRequest } from '../../../testing/mock-api';
import { jsonResponse, renderApp } from '../../../testing/render-app';

const SITE_ID = '7d1e2f30-3333-4a4a-9b9b-000000000002';
const GATE = { id: '7d1e2f30-3333-4a4a-9b9b-000000000041', label: 'Gate post', x: 3, y: -2, notes: null };
const CORNER = { id: '7d1e2f30-3333-4a4a-9b9b-000000000042', label: 'House corner', x: 0, y: 0, notes: null };

function buildSite(referencePoints: SiteResponse['referencePoints']): SiteResponse {
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

  it('should delete a point after confirming and put it back on Undo', async () => {
    let site = buildSite([CORNER, GATE]);
    const requests: MockRequest[] = [];
    mockApi({
      [`GET /api/sites/${SITE_ID}`]: () => jsonResponse(site),
      [`DELETE /api/sites/${SITE_ID}/reference-points/${GATE.id}`]: (request) => {
        requests.push(request);
        site = buildSite([CORNER]);
        return new Response(null, { status: 204 });
      },
      [`POST /api/sites/${SITE_ID}/reference-points`]: (request) => {
        requests.push(request);
        site = buildSite([CORNER, { ...GATE, id: '7d1e2f30-3333-4a4a-9b9b-000000000043' }]);
        return jsonResponse(site.referencePoints[1], 201);
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
    expect(requests[1]!.body).toEqual({ label: 'Gate post', x: 3, y: -2 });
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
});
