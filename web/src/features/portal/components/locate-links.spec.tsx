import { screen, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';

import { buildSessionUser } from '../../../testing/data';
import { mockApi, type MockRequest } from '../../../testing/mock-api';
import { jsonResponse, renderApp } from '../../../testing/render-app';
import { buildSiteMap } from '../../locate/testing-fixtures';

const SITE_ID = '00000000-0000-4000-8000-000000000001';
const LINK_ID = '00000000-0000-4000-8000-000000000011';

const site = {
  id: SITE_ID,
  label: 'Wrenfold Close',
  addressLine1: '12 Wrenfold Close',
  addressLine2: null,
  city: 'Quellbrook',
  region: 'XX',
  postalCode: '00000',
  country: 'US',
  installer: { companyName: 'Garden Sound Co', phone: null, email: 'office@gardensound.test', licenceNumbers: [] },
  packetCount: 1,
  lastIssuedAt: '2026-05-01T10:00:00.000Z',
  packets: [
    {
      id: '00000000-0000-4000-8000-000000000101',
      jobId: '00000000-0000-4000-8000-000000000201',
      jobTitle: 'Backyard audio',
      revision: 1,
      issuedAt: '2026-05-01T10:00:00.000Z',
      pageCount: 8,
      pdf: { bytes: 120_000, sha256: 'a'.repeat(64), url: '/api/portal/packets/p/pdf' },
      archive: { bytes: 300_000, sha256: 'b'.repeat(64), url: '/api/portal/packets/p/archive.zip' },
      isLatest: true,
    },
  ],
  mapUrl: `/api/portal/sites/${SITE_ID}/map`,
  locateLinksUrl: `/api/sites/${SITE_ID}/locate-links`,
};

const link = {
  id: LINK_ID,
  siteId: SITE_ID,
  note: 'For the fence crew',
  createdBy: { id: '00000000-0000-4000-8000-000000000021', name: 'Hanna Homeowner' },
  createdAt: '2026-06-01T10:00:00.000Z',
  expiresAt: '2026-06-15T10:00:00.000Z',
  revokedAt: null,
  isLongLived: false,
  isActive: true,
  accessCount: 0,
  lastAccessedAt: null,
};

describe('Portal locate links', () => {
  it('should create a link, show its URL once, list it and revoke it after confirmation', async () => {
    let links: unknown[] = [];
    let created: MockRequest | undefined;
    let revoked = false;
    mockApi({
      [`GET /api/portal/sites/${SITE_ID}`]: () => jsonResponse(site),
      [`GET /api/portal/sites/${SITE_ID}/map`]: () => jsonResponse(buildSiteMap()),
      [`GET /api/sites/${SITE_ID}/locate-links`]: () => jsonResponse(links),
      [`POST /api/sites/${SITE_ID}/locate-links`]: (request) => {
        created = request;
        links = [link];
        return jsonResponse({ ...link, url: 'https://loamline.test/locate/secret-token', token: 'secret-token' }, 201);
      },
      [`DELETE /api/locate-links/${LINK_ID}`]: () => {
        revoked = true;
        links = [{ ...link, isActive: false, revokedAt: '2026-06-02T10:00:00.000Z' }];
        return new Response(null, { status: 204 });
      },
    });

    const { user } = renderApp({ url: `/portal/sites/${SITE_ID}`, signedInAs: buildSessionUser('homeowner') });

    expect(await screen.findByRole('heading', { name: 'Wrenfold Close' })).toBeInTheDocument();
    expect(screen.getByText(`SHA-256 ${'a'.repeat(64)}`)).toBeInTheDocument();
    expect(await screen.findByText('No locate links yet.')).toBeInTheDocument();

    await user.click(screen.getByRole('button', { name: 'New locate link' }));
    const dialog = await screen.findByRole('dialog', { hidden: true });
    const days = within(dialog).getByRole('spinbutton', { name: /Works for/, hidden: true });
    await user.clear(days);
    await user.type(days, '30');
    await user.type(within(dialog).getByRole('textbox', { name: /Note/, hidden: true }), 'For the fence crew');
    await user.click(within(dialog).getByRole('button', { name: 'Create link', hidden: true }));

    expect(await within(dialog).findByRole('textbox', { name: 'New locate link', hidden: true })).toHaveValue('https://loamline.test/locate/secret-token');
    expect(within(dialog).getByText(/cannot be shown again/)).toBeInTheDocument();
    expect(created?.body).toEqual({ expiresInDays: 30, note: 'For the fence crew' });

    await user.click(within(dialog).getByRole('button', { name: 'Done', hidden: true }));
    const list = await screen.findByRole('list', { name: 'Locate links' });
    expect(within(list).getByText(/Opened 0 times/)).toBeInTheDocument();
    expect(screen.queryByText('https://loamline.test/locate/secret-token')).not.toBeInTheDocument();

    await user.click(within(list).getByRole('button', { name: 'Revoke' }));
    const confirm = await screen.findByRole('alertdialog', { name: 'Revoke this link?', hidden: true });
    await user.click(within(confirm).getByRole('button', { name: 'Revoke', hidden: true }));

    expect(await within(list).findByText('revoked')).toBeInTheDocument();
    expect(revoked).toBe(true);
    expect(within(list).queryByRole('button', { name: 'Revoke' })).not.toBeInTheDocument();
  });

  it('should refuse the portal to staff', async () => {
    mockApi({});
    renderApp({ url: `/portal/sites/${SITE_ID}`, signedInAs: buildSessionUser('office') });
    expect(await screen.findByRole('heading', { name: 'No access to this page' })).toBeInTheDocument();
  });
});
