import { screen, waitFor, within } from '@testing-library/react';
import { beforeEach, describe, expect, it } from 'vitest';
import type { CompanySettingsResponse, MyPreferencesResponse } from '@domain/settings/settings.schema';

import { buildSessionUser } from '../../../testing/data';
import { buildAsBuilt, buildJobAsBuilt, JOB_IDS } from '../../../testing/job-data';
import { apiErrorResponse, mockApi, type MockRequest } from '../../../testing/mock-api';
import { jsonResponse, renderApp } from '../../../testing/render-app';

const COMPANY: CompanySettingsResponse = { lengthUnits: 'metric', gaugeUnits: 'mm2', paperSize: 'a4', updatedAt: '2026-04-01T09:00:00.000Z' };

function preferences(own: { lengthUnits: 'imperial' | 'metric' | null; gaugeUnits: 'awg' | 'mm2' | null }): MyPreferencesResponse {
  return {
    ...own,
    company: { lengthUnits: COMPANY.lengthUnits, gaugeUnits: COMPANY.gaugeUnits, timeZone: null, locale: 'en-US' },
    effective: { length: own.lengthUnits ?? COMPANY.lengthUnits, gauge: own.gaugeUnits ?? COMPANY.gaugeUnits },
  };
}

describe('Settings', () => {
  beforeEach(() => localStorage.clear());

  it('should follow the company default until I choose, keep my choice on my account, and go back to the default', async () => {
    const patches: MockRequest[] = [];
    let mine = preferences({ lengthUnits: null, gaugeUnits: null });
    mockApi({
      'GET /api/company/settings': () => jsonResponse(COMPANY),
      'GET /api/me/preferences': () => jsonResponse(mine),
      'PATCH /api/me/preferences': (request) => {
        patches.push(request);
        mine = preferences(request.body as { lengthUnits: 'imperial' | null; gaugeUnits: null });
        return jsonResponse(mine);
      },
    });
    const { user } = renderApp({ url: '/settings', signedInAs: buildSessionUser('lead') });
    const lengths = await screen.findByRole('radiogroup', { name: 'Your lengths' }, { timeout: 10_000 });
    await waitFor(() => expect(within(lengths).getByRole('radio', { name: 'Company default (Metres and centimetres)' })).toBeChecked());

    await user.click(within(lengths).getByRole('radio', { name: 'Feet and inches' }));
    await waitFor(() => expect(patches).toHaveLength(1));
    expect(patches[0]!.body).toEqual({ lengthUnits: 'imperial', gaugeUnits: null });
    await waitFor(() => expect(within(lengths).getByRole('radio', { name: 'Feet and inches' })).toBeChecked());
    expect(JSON.parse(localStorage.getItem('loamline.units')!)).toMatchObject({ length: 'imperial', gauge: 'mm2', synced: true });

    await user.click(within(lengths).getByRole('radio', { name: /^Company default/ }));
    await waitFor(() => expect(patches).toHaveLength(2));
    expect(patches[1]!.body).toEqual({ lengthUnits: null, gaugeUnits: null });
    await waitFor(() => expect(JSON.parse(localStorage.getItem('loamline.units')!)).toMatchObject({ length: 'metric', synced: true }));
  }, 30_000);

  it('should end on the last of two quick choices, even when the first is still on its way', async () => {
    const patches: MockRequest[] = [];
    let release: () => void = () => undefined;
    mockApi({
      'GET /api/company/settings': () => jsonResponse(COMPANY),
      'GET /api/me/preferences': () => jsonResponse(preferences({ lengthUnits: null, gaugeUnits: null })),
      'PATCH /api/me/preferences': async (request) => {
        patches.push(request);
        if (patches.length === 1) await new Promise<void>((resolve) => (release = resolve));
        return jsonResponse(preferences(request.body as { lengthUnits: 'imperial' | 'metric' | null; gaugeUnits: null }));
      },
    });
    const { user } = renderApp({ url: '/settings', signedInAs: buildSessionUser('lead') });
    const lengths = await screen.findByRole('radiogroup', { name: 'Your lengths' }, { timeout: 10_000 });
    await waitFor(() => expect(within(lengths).getByRole('radio', { name: /^Company default/ })).toBeChecked());
    await user.click(within(lengths).getByRole('radio', { name: 'Feet and inches' }));
    await waitFor(() => expect(patches).toHaveLength(1));
    await user.click(within(lengths).getByRole('radio', { name: 'Metres and centimetres' }));
    release();
    await waitFor(() => expect(patches).toHaveLength(2));
    expect(patches.map((p) => (p.body as { lengthUnits: string }).lengthUnits)).toEqual(['imperial', 'metric']);
    await waitFor(() => expect(JSON.parse(localStorage.getItem('loamline.units')!)).toMatchObject({ length: 'metric', synced: true }));
    expect(within(lengths).getByRole('radio', { name: 'Metres and centimetres' })).toBeChecked();
  }, 30_000);

  it('should keep a choice made offline on this device and send it when the connection returns', async () => {
    const patches: MockRequest[] = [];
    let isOnline = false;
    mockApi({
      'GET /api/company/settings': () => jsonResponse(COMPANY),
      'GET /api/me/preferences': () => jsonResponse(preferences({ lengthUnits: null, gaugeUnits: null })),
      'PATCH /api/me/preferences': (request) => {
        patches.push(request);
        if (!isOnline) throw new TypeError('Failed to fetch');
        return jsonResponse(preferences(request.body as { lengthUnits: null; gaugeUnits: 'awg' }));
      },
    });
    const { user } = renderApp({ url: '/settings', signedInAs: buildSessionUser('tech') });
    const sizes = await screen.findByRole('radiogroup', { name: 'Your wire sizes' }, { timeout: 10_000 });
    await waitFor(() => expect(within(sizes).getByRole('radio', { name: 'Company default (mm²)' })).toBeChecked());
    await user.click(within(sizes).getByRole('radio', { name: 'AWG' }));
    await waitFor(() => expect(patches).toHaveLength(1));
    // Shown at once, and kept as a choice the server does not have yet.
    expect(within(sizes).getByRole('radio', { name: 'AWG' })).toBeChecked();
    expect(JSON.parse(localStorage.getItem('loamline.units')!)).toMatchObject({ gauge: 'awg', own: { lengthUnits: null, gaugeUnits: 'awg' } });
    expect(JSON.parse(localStorage.getItem('loamline.units')!)).not.toHaveProperty('synced');

    isOnline = true;
    window.dispatchEvent(new Event('online'));
    await waitFor(() => expect(patches).toHaveLength(2));
    expect(patches[1]!.body).toEqual({ lengthUnits: null, gaugeUnits: 'awg' });
    await waitFor(() => expect(JSON.parse(localStorage.getItem('loamline.units')!)).toMatchObject({ gauge: 'awg', synced: true }));
  }, 30_000);

  it('should let the admin change only what changed, and show the company defaults read-only to others', async () => {
    const patches: MockRequest[] = [];
    mockApi({
      'GET /api/company/settings': () => jsonResponse(COMPANY),
      'GET /api/me/preferences': () => jsonResponse(preferences({ lengthUnits: null, gaugeUnits: null })),
      'PATCH /api/company/settings': (request) => {
        patches.push(request);
        if (patches.length === 1) {
          return apiErrorResponse(400, { message: 'paperSize: Invalid option', issues: [{ path: 'paperSize', message: 'invalid option' }] });
        }
        return jsonResponse({ ...COMPANY, ...(request.body as object) });
      },
    });
    const admin = renderApp({ url: '/settings', signedInAs: buildSessionUser('admin') });
    const form = await screen.findByRole('form', { name: 'Company defaults' }, { timeout: 10_000 });
    expect(within(form).getByRole('button', { name: 'Save company settings' })).toBeDisabled();
    await admin.user.click(within(form).getByRole('radio', { name: 'US Letter' }));
    await admin.user.click(within(form).getByRole('button', { name: 'Save company settings' }));
    await waitFor(() => expect(patches).toHaveLength(1));
    expect(patches[0]!.body).toEqual({ paperSize: 'letter' });
    expect(await within(form).findByText('Invalid option.')).toBeInTheDocument();

    await admin.user.click(within(form).getByRole('button', { name: 'Save company settings' }));
    await waitFor(() => expect(patches).toHaveLength(2));
    expect(await screen.findByText('Company settings saved', undefined, { timeout: 10_000 })).toBeInTheDocument();
    admin.unmount();

    renderApp({ url: '/settings', signedInAs: buildSessionUser('office') });
    const readOnly = await screen.findByRole('form', { name: 'Company defaults' }, { timeout: 10_000 });
    expect(within(readOnly).getByText('Only an admin changes the company’s defaults.')).toBeInTheDocument();
    expect(within(readOnly).getByRole('radio', { name: 'A4' })).toBeChecked();
    expect(within(readOnly).getByRole('radio', { name: 'A4' })).toBeDisabled();
    expect(within(readOnly).queryByRole('button', { name: 'Save company settings' })).not.toBeInTheDocument();
  }, 30_000);

  it('should show the job in the units the server says, whatever the browser’s language', async () => {
    mockApi({
      [`GET /api/jobs/${JOB_IDS.job}/as-built`]: () => jsonResponse(buildJobAsBuilt(buildAsBuilt())),
      'GET /api/me/preferences': () => jsonResponse(preferences({ lengthUnits: null, gaugeUnits: null })),
    });
    const { user } = renderApp({ url: `/jobs/${JOB_IDS.job}`, signedInAs: buildSessionUser('lead') });
    const run = await screen.findByRole('listitem', { name: 'Run Patio trunk' }, { timeout: 10_000 });
    // 12 m measured: the company works in metres, so the run shows metres on a US browser too.
    await waitFor(() => expect(within(run).getByText('12 m')).toBeInTheDocument());
    await user.click(within(run).getByRole('button', { name: 'Add depth reading' }));
    expect(within(run).getByText(/cm of cover is required/)).toBeInTheDocument();
  }, 30_000);
});
