import { screen } from '@testing-library/react';
import { describe, expect, it } from 'vitest';

import { apiErrorResponse, mockApi } from '../../../testing/mock-api';
import { jsonResponse, renderApp } from '../../../testing/render-app';

const open = { mode: 'open', hasCompanies: true, mailCaptured: true, contact: null };

async function fillIn(user: ReturnType<typeof renderApp>['user'], overrides: Partial<Record<string, string>> = {}) {
  const values = {
    company: 'Brambleford Outdoor Audio',
    name: 'Ilse Marrow',
    email: 'ilse@brambleford.example',
    password: 'quiet meadow lanterns',
    ...overrides,
  };
  // Pasted, not typed key by key: the page re-renders on each key, which is slow under a loaded CPU.
  const enter = async (field: HTMLElement, text: string) => {
    await user.click(field);
    await user.paste(text);
  };
  await enter(await screen.findByLabelText(/^Company name/, {}, { timeout: 10_000 }), values.company);
  await enter(screen.getByLabelText(/^Your name/), values.name);
  await enter(screen.getByLabelText(/^E-mail/), values.email);
  await enter(screen.getByLabelText(/^Password/), values.password);
  await enter(screen.getByLabelText(/^Type the password again/), values.password);
}

describe('Create a company page', () => {
  it("should show the server's field errors under their fields", async () => {
    mockApi({
      'GET /api/signup/status': () => jsonResponse(open),
      'POST /api/signup': () =>
        apiErrorResponse(400, {
          message: 'companyName: must be at most 120 characters',
          code: 'VALIDATION_FAILED',
          issues: [
            { path: 'companyName', message: 'must be at most 120 characters' },
            { path: 'email', message: 'must be an e-mail address' },
          ],
        }),
    });
    const { user } = renderApp({ url: '/sign-up', signedInAs: null });

    await fillIn(user);
    await user.click(screen.getByRole('button', { name: 'Create the company' }));

    expect(await screen.findByText('Must be at most 120 characters.')).toBeInTheDocument();
    expect(screen.getByText('Must be an e-mail address.')).toBeInTheDocument();
    expect(screen.getByLabelText(/^Company name/)).toHaveAttribute('aria-invalid', 'true');
  });

  it('should check the fields before asking the server', async () => {
    const fetchMock = mockApi({ 'GET /api/signup/status': () => jsonResponse(open) });
    const { user } = renderApp({ url: '/sign-up', signedInAs: null });

    await fillIn(user, { password: 'short' });
    await user.click(screen.getByRole('button', { name: 'Create the company' }));

    expect(await screen.findByText('Must be at least 10 characters.')).toBeInTheDocument();
    expect(fetchMock.mock.calls.some(([, init]) => init?.method === 'POST')).toBe(false);
  });

  it('should ask for the invitation code when sign-up is by invitation, and name it when refused', async () => {
    mockApi({
      'GET /api/signup/status': () => jsonResponse({ ...open, mode: 'invite', contact: 'ops@operator.example' }),
      'POST /api/signup': () =>
        apiErrorResponse(400, {
          message: 'inviteCode: is not valid, has expired or has been used',
          code: 'VALIDATION_FAILED',
          issues: [{ path: 'inviteCode', message: 'is not valid, has expired or has been used' }],
        }),
    });
    const { user } = renderApp({ url: '/sign-up', signedInAs: null });

    await fillIn(user);
    await user.click(screen.getByLabelText(/^Invitation code/));
    await user.paste('LMC-WRONG-CODE');
    await user.click(screen.getByRole('button', { name: 'Create the company' }));

    expect(await screen.findByText('Is not valid, has expired or has been used.')).toBeInTheDocument();
    expect(screen.getByText(/from ops@operator.example/)).toBeInTheDocument();
  });

  it('should show the captured message with its link after an accepted request', async () => {
    mockApi({
      'GET /api/signup/status': () => jsonResponse(open),
      'POST /api/signup': () => jsonResponse({ message: 'Check your e-mail: we sent a message to that address.', receipt: 'r'.repeat(43) }, 202),
      [`GET /api/signup/mail/${'r'.repeat(43)}`]: () =>
        jsonResponse({
          status: 'sent',
          message: {
            to: ['ilse@brambleford.example'],
            subject: 'Confirm your address to create Brambleford Outdoor Audio in Loamline',
            receivedAt: '2026-12-02T15:00:00.000Z',
            text: 'Confirm here:\nhttp://127.0.0.1:3000/sign-up/verify?token=abcdefghijklmnopqrstuvwxyz012345',
            html: null,
          },
        }),
    });
    const { user } = renderApp({ url: '/sign-up', signedInAs: null });

    await fillIn(user);
    await user.click(screen.getByRole('button', { name: 'Create the company' }));

    expect(await screen.findByRole('heading', { name: 'Check your e-mail' })).toBeInTheDocument();
    expect(await screen.findByRole('link', { name: 'Confirm and create the company' })).toHaveAttribute(
      'href',
      '/sign-up/verify?token=abcdefghijklmnopqrstuvwxyz012345',
    );
  });

  it('should say that sign-up is closed, and whom to ask', async () => {
    mockApi({ 'GET /api/signup/status': () => jsonResponse({ ...open, mode: 'closed', contact: 'ops@operator.example' }) });
    renderApp({ url: '/sign-up', signedInAs: null });

    expect(await screen.findByRole('heading', { name: 'Sign-up is closed' })).toBeInTheDocument();
    expect(screen.getByText(/Ask ops@operator.example/)).toBeInTheDocument();
    expect(screen.queryByRole('button', { name: 'Create the company' })).not.toBeInTheDocument();
  });
});
