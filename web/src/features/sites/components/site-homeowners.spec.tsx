import { screen, waitFor, within } from '@testing-library/react';
import { beforeEach, describe, expect, it } from 'vitest';
import type { SiteResponse } from '@domain/sites/site.schema';

import { buildSessionUser, buildUserResponse, buildPage } from '../../../testing/data';
import { apiErrorResponse, mockApi, type MockRequest } from '../../../testing/mock-api';
import { jsonResponse, renderApp } from '../../../testing/render-app';

const SITE_ID = '7d1e2f30-2222-4a4a-9b9b-000000000002';
const OWNER = buildUserResponse('homeowner');
const SECOND_OWNER = buildUserResponse('homeowner', { id: '0b7f3c1e-4a52-4d6b-9a11-2f5e8c7d9a15', name: 'Merrit Colbane', email: 'merrit@owners.example' });

function buildSite(homeowners: SiteResponse['homeowners']): SiteResponse {
  return {
    id: SITE_ID,
    label: 'Thistledown garden',
    customer: { id: '7d1e2f30-2222-4a4a-9b9b-000000000003', name: 'Perrin Ashgrove' },
    addressLine1: '4 Brambleway',
    addressLine2: null,
    city: 'Marrowby',
    region: null,
    postalCode: '00001',
    country: 'Testland',
    northAzimuthDeg: 0,
    origin: null,
    planImage: null,
    planCalibration: null,
    notes: null,
    referencePoints: [],
    homeowners,
    jobs: [],
    version: 1,
    createdAt: '2026-04-01T09:00:00.000Z',
    updatedAt: '2026-04-01T09:00:00.000Z',
  };
}

async function dialogTitled(title: string) {
  const heading = await screen.findByText(title, { selector: 'h2' }, { timeout: 10_000 });
  return within(heading.closest<HTMLElement>('[role="dialog"], [role="alertdialog"]')!);
}

describe('SiteHomeowners', () => {
  beforeEach(() => localStorage.clear());

  it('should link an existing homeowner account and offer only homeowners not linked yet', async () => {
    let site = buildSite([{ id: OWNER.id, name: OWNER.name, email: OWNER.email }]);
    const links: MockRequest[] = [];
    mockApi({
      [`GET /api/sites/${SITE_ID}`]: () => jsonResponse(site),
      'GET /api/users?pageSize=100': () => jsonResponse(buildPage([buildUserResponse('admin'), buildUserResponse('tech'), OWNER, SECOND_OWNER])),
      [`POST /api/sites/${SITE_ID}/homeowners`]: (request) => {
        links.push(request);
        site = buildSite([...site.homeowners, { id: SECOND_OWNER.id, name: SECOND_OWNER.name, email: SECOND_OWNER.email }]);
        return jsonResponse(site.homeowners, 201);
      },
    });
    const { user } = renderApp({ url: `/sites/${SITE_ID}`, signedInAs: buildSessionUser('office') });
    await user.click(await screen.findByRole('button', { name: 'Add homeowner' }, { timeout: 10_000 }));
    const dialog = await dialogTitled('Add a homeowner to Thistledown garden');
    const select = dialog.getByLabelText(/Homeowner/);
    await waitFor(() => expect(within(select).getAllByRole('option', { hidden: true })).toHaveLength(2));
    expect(within(select).getAllByRole('option', { hidden: true }).map((o) => o.textContent)).toEqual([
      'Choose a homeowner',
      'Merrit Colbane (merrit@owners.example)',
    ]);

    await user.click(dialog.getByRole('button', { name: 'Link homeowner', hidden: true }));
    expect(await dialog.findByText('Choose the homeowner to link.')).toBeInTheDocument();
    expect(links).toHaveLength(0);

    await user.selectOptions(select, SECOND_OWNER.id);
    await user.click(dialog.getByRole('button', { name: 'Link homeowner', hidden: true }));
    await waitFor(() => expect(links).toHaveLength(1));
    expect(links[0]!.body).toEqual({ userId: SECOND_OWNER.id });
    const list = await screen.findByRole('list', { name: 'Homeowners' }, { timeout: 10_000 });
    await waitFor(() => expect(within(list).getByText('Merrit Colbane')).toBeInTheDocument());
  }, 30_000);

  it('should invite a new homeowner by e-mail and show the API’s field error', async () => {
    const invites: MockRequest[] = [];
    mockApi({
      [`GET /api/sites/${SITE_ID}`]: () => jsonResponse(buildSite([])),
      'GET /api/users?pageSize=100': () => jsonResponse(buildPage([OWNER])),
      [`POST /api/sites/${SITE_ID}/homeowner-invitations`]: (request) => {
        invites.push(request);
        if (invites.length === 1) {
          return apiErrorResponse(400, { message: 'email: must be an e-mail address', issues: [{ path: 'email', message: 'must be an e-mail address' }] });
        }
        return jsonResponse(
          { id: '7d1e2f30-2222-4a4a-9b9b-0000000000aa', email: 'new.owner@owners.example', name: null, role: 'homeowner', expiresAt: '2026-05-01T00:00:00.000Z', createdAt: '2026-04-24T00:00:00.000Z' },
          201,
        );
      },
    });
    const { user } = renderApp({ url: `/sites/${SITE_ID}`, signedInAs: buildSessionUser('admin') });
    expect(await screen.findByText('No homeowner account is linked to this site yet.', undefined, { timeout: 10_000 })).toBeInTheDocument();
    await user.click(screen.getByRole('button', { name: 'Add homeowner' }));
    const dialog = await dialogTitled('Add a homeowner to Thistledown garden');
    await user.click(dialog.getByLabelText('Invite them by e-mail'));

    await user.type(dialog.getByLabelText(/E-mail/), 'not an address');
    await user.click(dialog.getByRole('button', { name: 'Send invitation', hidden: true }));
    expect(await dialog.findByText('Must be an e-mail address.')).toBeInTheDocument();
    expect(invites).toHaveLength(0);

    await user.clear(dialog.getByLabelText(/E-mail/));
    await user.type(dialog.getByLabelText(/E-mail/), 'Server.Says.No@owners.example');
    await user.click(dialog.getByRole('button', { name: 'Send invitation', hidden: true }));
    await waitFor(() => expect(invites).toHaveLength(1));
    expect(invites[0]!.body).toEqual({ email: 'server.says.no@owners.example' });
    expect(await dialog.findByText('Must be an e-mail address.')).toBeInTheDocument();

    await user.type(dialog.getByLabelText(/^Name/), 'Lorne Pebbleton');
    await user.click(dialog.getByRole('button', { name: 'Send invitation', hidden: true }));
    await waitFor(() => expect(invites).toHaveLength(2));
    expect(invites[1]!.body).toEqual({ email: 'server.says.no@owners.example', name: 'Lorne Pebbleton' });
    expect(await screen.findByText('Invitation sent', undefined, { timeout: 10_000 })).toBeInTheDocument();
  }, 30_000);

  it('should unlink after confirming, and show no changes to a crew lead', async () => {
    const unlinks: MockRequest[] = [];
    let site = buildSite([{ id: OWNER.id, name: OWNER.name, email: OWNER.email }]);
    mockApi({
      [`GET /api/sites/${SITE_ID}`]: () => jsonResponse(site),
      [`DELETE /api/sites/${SITE_ID}/homeowners/${OWNER.id}`]: (request) => {
        unlinks.push(request);
        site = buildSite([]);
        return new Response(null, { status: 204 });
      },
    });
    const office = renderApp({ url: `/sites/${SITE_ID}`, signedInAs: buildSessionUser('office') });
    await office.user.click(await screen.findByRole('button', { name: `Unlink ${OWNER.name}` }, { timeout: 10_000 }));
    const dialog = await dialogTitled(`Unlink ${OWNER.name}?`);
    expect(unlinks).toHaveLength(0);
    await office.user.click(dialog.getByRole('button', { name: 'Unlink', hidden: true }));
    await waitFor(() => expect(unlinks).toHaveLength(1));
    expect(await screen.findByText('No homeowner account is linked to this site yet.', undefined, { timeout: 10_000 })).toBeInTheDocument();
    office.unmount();

    site = buildSite([{ id: OWNER.id, name: OWNER.name, email: OWNER.email }]);
    renderApp({ url: `/sites/${SITE_ID}`, signedInAs: buildSessionUser('lead') });
    expect(await screen.findByText(OWNER.name, undefined, { timeout: 10_000 })).toBeInTheDocument();
    expect(screen.queryByRole('button', { name: /Unlink|Add homeowner/ })).not.toBeInTheDocument();
  }, 30_000);
});
