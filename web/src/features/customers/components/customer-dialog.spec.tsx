import { screen, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';

import { buildPage, buildSessionUser } from '../../../testing/data';
import { apiErrorResponse, mockApi } from '../../../testing/mock-api';
import { jsonResponse, renderApp } from '../../../testing/render-app';

const saved = {
  id: '3c1f0d2e-6a4b-4d8e-9f70-1a2b3c4d5e6f',
  name: 'Willowmere Residence',
  email: null,
  phone: '555-0148',
  notes: null,
  createdAt: '2026-03-02T08:00:00.000Z',
  updatedAt: '2026-03-02T08:00:00.000Z',
};

async function openNewCustomerDialog(routes: Parameters<typeof mockApi>[0]) {
  const fetchMock = mockApi({ 'GET /api/customers': () => jsonResponse(buildPage([])), ...routes });
  const rendered = renderApp({ url: '/customers', signedInAs: buildSessionUser('office') });
  await rendered.user.click(await screen.findByRole('button', { name: 'New customer' }));
  // Found through its title (see invite-dialog.spec.tsx: a page-wide role query is slow in jsdom).
  const title = await screen.findByText('New customer', { selector: 'h2' });
  return { ...rendered, fetchMock, dialog: within(title.closest<HTMLElement>('[role="dialog"]')!) };
}

describe('CustomerDialog (on the shared FormDialog)', () => {
  it('should name an empty required field under it and send nothing', async () => {
    const { user, dialog, fetchMock } = await openNewCustomerDialog({});
    await user.click(dialog.getByRole('button', { name: 'Save', hidden: true }));
    const name = dialog.getByLabelText(/Name/);
    expect(name).toHaveAccessibleDescription(/.+/);
    expect(fetchMock.mock.calls.some(([, init]) => init?.method === 'POST')).toBe(false);
  });

  it('should send blank optional fields as null and confirm the new customer', async () => {
    const { user, dialog, fetchMock } = await openNewCustomerDialog({ 'POST /api/customers': () => jsonResponse(saved, 201) });
    await user.type(dialog.getByLabelText(/Name/), 'Willowmere Residence');
    await user.type(dialog.getByLabelText(/Phone/), '555-0148');
    await user.click(dialog.getByRole('button', { name: 'Save', hidden: true }));

    expect(await screen.findByText('Customer added')).toBeInTheDocument();
    const call = fetchMock.mock.calls.find(([url, init]) => url === '/api/customers' && init?.method === 'POST');
    expect(JSON.parse(String(call?.[1]?.body))).toEqual({ name: 'Willowmere Residence', email: null, phone: '555-0148', notes: null });
  });

  it('should show the API field issues under their fields and keep the dialog open', async () => {
    const { user, dialog } = await openNewCustomerDialog({
      'POST /api/customers': () =>
        apiErrorResponse(400, { message: 'email: must be an e-mail address', code: 'VALIDATION_FAILED', issues: [{ path: 'email', message: 'must be an e-mail address' }] }),
    });
    await user.type(dialog.getByLabelText(/Name/), 'Willowmere Residence');
    await user.type(dialog.getByLabelText(/E-mail/), 'office@willowmere.example');
    await user.click(dialog.getByRole('button', { name: 'Save', hidden: true }));

    expect(await dialog.findByText('Must be an e-mail address.')).toBeInTheDocument();
    expect(dialog.getByLabelText(/Name/)).toHaveValue('Willowmere Residence');
  });
});
