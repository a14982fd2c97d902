import { screen } from '@testing-library/react';
import { describe, expect, it } from 'vitest';

import { buildSessionResponse, buildSessionUser, buildPage } from '../../../testing/data';
import { apiErrorResponse, mockApi } from '../../../testing/mock-api';
import { jsonResponse, renderApp } from '../../../testing/render-app';

const office = buildSessionUser('office');
const signupStatus = { mode: 'open', hasCompanies: true, mailCaptured: true, contact: null };

describe('SignInForm', () => {
  it('should say which boxes are empty or wrong without asking the server', async () => {
    const fetchMock = mockApi({});
    const { user } = renderApp({ url: '/sign-in', signedInAs: null });

    await user.click(await screen.findByRole('button', { name: 'Sign in' }));

    expect(screen.getByText('Enter your e-mail address.')).toBeInTheDocument();
    expect(screen.getByText('Enter your password.')).toBeInTheDocument();

    await user.type(screen.getByLabelText(/E-mail/), 'not-an-address');
    await user.click(screen.getByRole('button', { name: 'Sign in' }));

    expect(screen.getByText('Must be an e-mail address.')).toBeInTheDocument();
    // Only the page's own question (may companies sign up here?), never a sign-in attempt.
    expect(fetchMock.mock.calls.filter(([url]) => !String(url).startsWith('/api/signup/status'))).toEqual([]);
  });

  it('should explain a refused sign-in in one message, the same for any cause', async () => {
    mockApi({
      'POST /api/auth/sign-in': () =>
        apiErrorResponse(401, { message: 'E-mail or password is wrong.', code: 'SIGN_IN_FAILED' }),
    });
    const { user } = renderApp({ url: '/sign-in', signedInAs: null });

    await user.type(await screen.findByLabelText(/E-mail/), 'office@fernhollow.example');
    await user.type(screen.getByLabelText(/^Password/), 'wrong password');
    await user.click(screen.getByRole('button', { name: 'Sign in' }));

    expect(await screen.findByText(/do not match an account that can sign in/)).toBeInTheDocument();
  });

  it('should show the server field issues on the fields', async () => {
    mockApi({
      'POST /api/auth/sign-in': () =>
        apiErrorResponse(400, {
          message: 'Validation failed',
          code: 'VALIDATION_FAILED',
          issues: [{ path: 'email', message: 'is not accepted here' }],
        }),
    });
    const { user } = renderApp({ url: '/sign-in', signedInAs: null });

    await user.type(await screen.findByLabelText(/E-mail/), 'office@fernhollow.example');
    await user.type(screen.getByLabelText(/^Password/), 'a password');
    await user.click(screen.getByRole('button', { name: 'Sign in' }));

    expect(await screen.findByText('Is not accepted here.')).toBeInTheDocument();
  });

  it('should sign in and go on to the page in `next`', async () => {
    const fetchMock = mockApi({
      'POST /api/auth/sign-in': () => jsonResponse(buildSessionResponse(office, 'fresh-token')),
      'GET /api/users?pageSize=100': () => jsonResponse(buildPage([])),
      'GET /api/invitations': () => jsonResponse([]),
      'GET /api/signup/status': () => jsonResponse(signupStatus),
      'GET /api/outbox/status': () => jsonResponse({ captured: true, destination: null }),
    });
    const { user, router } = renderApp({ url: '/sign-in?next=%2Fusers', signedInAs: null });

    await user.type(await screen.findByLabelText(/E-mail/), '  Office@Fernhollow.example ');
    await user.type(screen.getByLabelText(/^Password/), 'correct horse battery');
    await user.click(screen.getByRole('button', { name: 'Sign in' }));

    expect(await screen.findByRole('heading', { name: 'Users' }, { timeout: 20_000 })).toBeInTheDocument();
    expect(router.state.location.pathname).toBe('/users');
    const signInCall = fetchMock.mock.calls.find(([url]) => url === '/api/auth/sign-in');
    expect(JSON.parse(String(signInCall?.[1]?.body))).toEqual({
      email: 'office@fernhollow.example',
      password: 'correct horse battery',
    });
    const usersCall = fetchMock.mock.calls.find(([url]) => String(url).startsWith('/api/users?'));
    expect(new Headers(usersCall?.[1]?.headers).get('Authorization')).toBe('Bearer fresh-token');
    expect(screen.getByRole('button', { name: `Account: ${office.name}` })).toBeInTheDocument();
  }, 40_000);

  it('should not follow a `next` that leaves the app', async () => {
    mockApi({
      'POST /api/auth/sign-in': () => jsonResponse(buildSessionResponse(office)),
      'GET /api/signup/status': () => jsonResponse(signupStatus),
      'GET /api/outbox/status': () => jsonResponse({ captured: true, destination: null }),
      // The office lands on the work queue (app/routes/app/home.tsx).
      'GET /api/jobs?status=submitted&sort=updatedAt&page=1&pageSize=25': () => jsonResponse({ items: [], total: 0, page: 1, pageSize: 25, nextCursor: null }),
      'GET /api/jobs?status=ready_to_issue&sort=updatedAt&page=1&pageSize=25': () => jsonResponse({ items: [], total: 0, page: 1, pageSize: 25, nextCursor: null }),
      'GET /api/deliveries/failed': () => jsonResponse([]),
    });
    const { user, router } = renderApp({ url: '/sign-in?next=%2F%2Fevil.example%2F', signedInAs: null });

    await user.type(await screen.findByLabelText(/E-mail/), 'office@fernhollow.example');
    await user.type(screen.getByLabelText(/^Password/), 'correct horse battery');
    await user.click(screen.getByRole('button', { name: 'Sign in' }));

    expect(await screen.findByRole('heading', { name: 'Work queue' }, { timeout: 20_000 })).toBeInTheDocument();
    expect(screen.getByText('No job is waiting for review.')).toBeInTheDocument();
    expect(router.state.location.pathname).toBe('/');
  }, 40_000);
});
