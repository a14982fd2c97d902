import { screen } from '@testing-library/react';
import { describe, expect, it } from 'vitest';

import { buildSessionResponse, buildSessionUser, buildUserResponse, buildPage } from '../../../testing/data';
import { apiErrorResponse, mockApi } from '../../../testing/mock-api';
import { jsonResponse, renderApp } from '../../../testing/render-app';

const admin = buildSessionUser('admin');
const noLocalMail = () => jsonResponse({ captured: false, destination: 'smtp://mail.relay.example:587' });

describe('the signed-in area', () => {
  it('should send a signed-out visitor to sign-in with the way back', async () => {
    mockApi({ 'POST /api/auth/refresh': () => apiErrorResponse(401, { message: 'No session.', code: 'SESSION_ENDED' }) });

    const { router } = renderApp({ url: '/users?sort=name', signedInAs: 'unknown' });

    expect(await screen.findByRole('heading', { name: 'Sign in' })).toBeInTheDocument();
    expect(router.state.location.pathname).toBe('/sign-in');
    expect(router.state.location.search).toBe(`?${new URLSearchParams({ next: '/users?sort=name' })}`);
  });

  it('should restore the session from the refresh cookie after a reload', async () => {
    mockApi({
      'POST /api/auth/refresh': () => jsonResponse(buildSessionResponse(admin, 'restored')),
      'GET /api/users?pageSize=100': () => jsonResponse(buildPage([buildUserResponse('admin')])),
      'GET /api/invitations': () => jsonResponse([]),
      'GET /api/outbox/status': noLocalMail,
    });

    renderApp({ url: '/users', signedInAs: 'unknown' });

    expect(await screen.findByRole('heading', { name: 'Users' })).toBeInTheDocument();
    expect(screen.getByRole('button', { name: `Account: ${admin.name}` })).toBeInTheDocument();
  });

  it('should go to sign-in and back to the same page when the session ends under the user', async () => {
    const ended = () => apiErrorResponse(401, { message: 'Session ended.', code: 'SESSION_ENDED' });
    mockApi({
      'GET /api/users?pageSize=100': () => apiErrorResponse(401, { message: 'Token expired.' }),
      'POST /api/auth/refresh': ended,
      'GET /api/outbox/status': noLocalMail,
    });

    const { router } = renderApp({ url: '/users', signedInAs: admin });

    expect(await screen.findByRole('heading', { name: 'Sign in' })).toBeInTheDocument();
    expect(screen.getByText(/Your session ended/)).toBeInTheDocument();
    expect(router.state.location.pathname).toBe('/sign-in');
    expect(new URLSearchParams(router.state.location.search).get('next')).toBe('/users');
  });
});
