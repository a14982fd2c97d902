import { screen, waitFor, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import type { CompanyDepthRulesResponse, CompanyProfileResponse } from '@domain/company/company-profile.schema';
import { DEFAULT_DEPTH_RULES } from '@domain/depth/depth-rules';

import { buildSessionUser } from '../../../testing/data';
import { apiErrorResponse, mockApi, type MockRequest } from '../../../testing/mock-api';
import { jsonResponse, renderApp } from '../../../testing/render-app';
import { IMPERIAL_PREFERENCES, IMPERIAL_SETTINGS } from '../testing-fixtures';

const PROFILE: CompanyProfileResponse = {
  tradeName: 'Larchwhistle Garden Audio',
  phone: '(555) 010-0131',
  email: 'office@larchwhistle.example',
  website: null,
  postalAddress: null,
  licenceNumbers: ['LV-LW-0007 (invented)'],
  timeZone: 'America/Denver',
  locale: 'en-US',
  logo: null,
  updatedAt: '2026-04-01T09:00:00.000Z',
};
const DEPTH: CompanyDepthRulesResponse = { table: DEFAULT_DEPTH_RULES, isDefault: true, defaults: DEFAULT_DEPTH_RULES };

function api(profile: () => CompanyProfileResponse, patch?: (request: MockRequest) => Response | Promise<Response>) {
  mockApi({
    'GET /api/company/settings': () => jsonResponse(IMPERIAL_SETTINGS),
    'GET /api/me/preferences': () => jsonResponse(IMPERIAL_PREFERENCES),
    'GET /api/company/profile': () => jsonResponse(profile()),
    'GET /api/company/depth-rules': () => jsonResponse(DEPTH),
    ...(patch ? { 'PATCH /api/company/profile': patch } : {}),
  });
}

describe('Company profile form', () => {
  it('should send only the changed fields, check the time zone before saving, and show the server’s answer under the field', async () => {
    const patches: MockRequest[] = [];
    let current = PROFILE;
    let refuseNext = false;
    api(
      () => current,
      (request) => {
        patches.push(request);
        if (refuseNext) {
          refuseNext = false;
          return apiErrorResponse(400, { message: 'timeZone: must be an IANA time zone name', code: 'VALIDATION_FAILED', issues: [{ path: 'timeZone', message: 'must be an IANA time zone name such as America/Denver' }] });
        }
        current = { ...current, ...(request.body as Partial<CompanyProfileResponse>) };
        return jsonResponse(current);
      },
    );
    const { user } = renderApp({ url: '/settings', signedInAs: buildSessionUser('admin') });
    const form = await screen.findByRole('form', { name: 'Company profile' }, { timeout: 30_000 });
    const phone = within(form).getByRole('textbox', { name: 'Phone' });
    await waitFor(() => expect(phone).toHaveValue('(555) 010-0131'));

    await user.clear(phone);
    await user.click(phone);
    await user.paste('555 010 0199');
    const zone = within(form).getByRole('textbox', { name: 'Time zone' });
    await user.clear(zone);
    await user.click(zone);
    await user.paste('Mars/Olympus');
    await user.click(within(form).getByRole('button', { name: 'Save company profile' }));
    expect(await within(form).findByText('Enter a time zone name such as America/Denver.')).toBeInTheDocument();
    expect(patches).toHaveLength(0);

    await user.clear(zone);
    await user.click(zone);
    await user.paste('America/Chicago');
    await user.click(within(form).getByRole('button', { name: 'Save company profile' }));
    await waitFor(() => expect(patches).toHaveLength(1));
    expect(patches[0]!.body).toEqual({ phone: '555 010 0199', timeZone: 'America/Chicago' });

    // The server refuses a zone this browser's Intl knows: its message shows under the field.
    refuseNext = true;
    await user.clear(zone);
    await user.click(zone);
    await user.paste('America/Denver');
    await user.click(within(form).getByRole('button', { name: 'Save company profile' }));
    expect(await within(form).findByText('Must be an IANA time zone name such as America/Denver.')).toBeInTheDocument();
  }, 60_000);

  it('should warn that packets carry no number when the phone is cleared', async () => {
    api(() => PROFILE, (request) => jsonResponse({ ...PROFILE, ...(request.body as object) }));
    const { user } = renderApp({ url: '/settings', signedInAs: buildSessionUser('admin') });
    const form = await screen.findByRole('form', { name: 'Company profile' }, { timeout: 30_000 });
    const phone = within(form).getByRole('textbox', { name: 'Phone' });
    await waitFor(() => expect(phone).toHaveValue('(555) 010-0131'));
    expect(within(form).queryByText(/packets carry no number/)).not.toBeInTheDocument();
    await user.clear(phone);
    expect(within(form).getByText(/packets carry no number/)).toBeInTheDocument();
  }, 60_000);

  it('should show the office the profile without a way to change it', async () => {
    api(() => PROFILE);
    renderApp({ url: '/settings', signedInAs: buildSessionUser('office') });
    const form = await screen.findByRole('form', { name: 'Company profile' }, { timeout: 30_000 });
    await waitFor(() => expect(within(form).getByRole('textbox', { name: /Trade name/ })).toHaveValue('Larchwhistle Garden Audio'));
    expect(within(form).getByRole('textbox', { name: /Trade name/ })).toBeDisabled();
    expect(within(form).getByText('Only an admin changes the company profile.')).toBeInTheDocument();
    expect(within(form).queryByRole('button', { name: 'Save company profile' })).not.toBeInTheDocument();
    expect(within(form).queryByRole('button', { name: /Upload logo/ })).not.toBeInTheDocument();
  }, 60_000);
});
