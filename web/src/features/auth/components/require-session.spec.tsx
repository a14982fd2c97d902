import { screen, waitFor } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';

import { buildSessionResponse, buildSessionUser, buildUserResponse, buildPage } from '../../../testing/data';
import { apiErrorResponse, mockApi } from '../../../testing/mock-api';
import { pageLoad } from '../../../lib/page-load';
import { resetSession } from '../../../lib/session';
import { jsonResponse, renderApp } from '../../../testing/render-app';
import { requireUser } from '../utils/require-user';

const admin = buildSessionUser('admin');
const noLocalMail = () => jsonResponse({ captured: false, destination: 'smtp://mail.relay.example:587' });

describe('the signed-in area', () => {
  afterEach(() => vi.restoreAllMocks());

  it('should send a signed-out visitor to sign-in with the way back, as a full page load (sign-in.html)', async () => {
    mockApi({ 'POST /api/auth/refresh': () => apiErrorResponse(401, { message: 'No session.', code: 'SESSION_ENDED' }) });
    resetSession();

    // The route loaders' guard: a document redirect, which React Router follows with a full page load.
    const redirect = await requireUser(new Request('http://localhost/users?sort=name')).then(
      () => undefined,
      (thrown: unknown) => thrown,
    );
    expect(redirect).toBeInstanceOf(Response);
    const response = redirect as Response;
    expect(response.status).toBe(302);
    expect(response.headers.get('X-Remix-Reload-Document')).toBe('true');
    expect(response.headers.get('Location')).toBe(`/sign-in?${new URLSearchParams({ next: '/users?sort=name' })}`);
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

    const load = vi.spyOn(pageLoad, 'replace').mockImplementation(() => undefined);

    renderApp({ url: '/users', signedInAs: admin });

    // The sign-in page is a page of its own: a full page load, saying why and with the way back.
    await waitFor(() => expect(load).toHaveBeenCalled());
    const url = new URL(load.mock.calls[0]![0], 'http://localhost');
    expect(url.pathname).toBe('/sign-in');
    expect(url.searchParams.get('next')).toBe('/users');
    expect(url.searchParams.get('expired')).toBe('1');
    expect(screen.queryByRole('heading', { name: 'Users' })).not.toBeInTheDocument();
  });
});
