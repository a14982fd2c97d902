import { beforeEach, describe, expect, it, vi } from 'vitest';
import { z } from 'zod';

import { buildSessionResponse, buildSessionUser } from '../testing/data';
import { apiErrorResponse, mockApi } from '../testing/mock-api';
import { jsonResponse } from '../testing/render-app';

import { ApiError, apiRequest, refreshSession } from './api-client';
import { getAccessToken, getSessionState, resetSession, setSession } from './session';

describe('apiRequest', () => {
  beforeEach(() => resetSession());

  it('should turn a 400 body into an ApiError with its issues', async () => {
    vi.spyOn(globalThis, 'fetch').mockResolvedValue(
      jsonResponse(
        {
          statusCode: 400,
          error: 'Bad Request',
          message: 'Validation failed',
          code: 'VALIDATION_FAILED',
          issues: [
            { path: 'name', message: 'Required' },
            { path: ['runs', 0, 'lengthM'], message: 'Must be positive' },
          ],
        },
        400,
      ),
    );

    const error = await apiRequest('/api/jobs', undefined, { method: 'POST', body: {} }).catch(
      (caught: unknown) => caught,
    );

    expect(error).toBeInstanceOf(ApiError);
    expect(error).toMatchObject({
      status: 400,
      code: 'VALIDATION_FAILED',
      message: 'Validation failed',
      issues: [
        { path: 'name', message: 'Required' },
        { path: 'runs.0.lengthM', message: 'Must be positive' },
      ],
    });
  });

  it('should send JSON with cookies and return the parsed body', async () => {
    const fetchMock = vi.spyOn(globalThis, 'fetch').mockResolvedValue(jsonResponse({ id: 7 }, 201));

    const result = await apiRequest('/api/things', z.object({ id: z.number() }), {
      method: 'POST',
      body: { name: 'Patio zone' },
    });

    expect(result).toEqual({ id: 7 });
    const [, init] = fetchMock.mock.calls[0] ?? [];
    expect(init).toMatchObject({ method: 'POST', credentials: 'include', body: '{"name":"Patio zone"}' });
    expect(new Headers(init?.headers).get('Content-Type')).toBe('application/json');
  });

  it('should return the body of a status the caller accepts', async () => {
    vi.spyOn(globalThis, 'fetch').mockResolvedValue(jsonResponse({ status: 'error' }, 503));

    const result = await apiRequest('/api/health', z.object({ status: z.string() }), { acceptStatuses: [503] });

    expect(result).toEqual({ status: 'error' });
  });

  it('should fall back to the status text when the error body is not ours', async () => {
    vi.spyOn(globalThis, 'fetch').mockResolvedValue(
      new Response('upstream unavailable', { status: 502, statusText: 'Bad Gateway' }),
    );

    await expect(apiRequest('/api/health')).rejects.toMatchObject({ status: 502, message: 'Bad Gateway', issues: [] });
  });

  it('should report status 0 when the server cannot be reached', async () => {
    vi.spyOn(globalThis, 'fetch').mockRejectedValue(new TypeError('Failed to fetch'));

    await expect(apiRequest('/api/health')).rejects.toMatchObject({ status: 0, code: 'NETWORK_ERROR' });
  });

  it('should reject an answer that does not match the schema', async () => {
    vi.spyOn(globalThis, 'fetch').mockResolvedValue(jsonResponse({ id: 'seven' }));

    await expect(apiRequest('/api/things/7', z.object({ id: z.number() }))).rejects.toMatchObject({
      status: 200,
      code: 'UNEXPECTED_RESPONSE',
    });
  });
});

describe('apiRequest with a session', () => {
  const user = buildSessionUser('office');
  const expired = () => apiErrorResponse(401, { message: 'Sign in again.', code: 'TOKEN_EXPIRED' });

  beforeEach(() => {
    setSession(buildSessionResponse(user, 'old-token'));
  });

  it('should send the access token as a Bearer header', async () => {
    const fetchMock = mockApi({ 'GET /api/things': () => jsonResponse([]) });

    await apiRequest('/api/things');

    const [, init] = fetchMock.mock.calls[0] ?? [];
    expect(new Headers(init?.headers).get('Authorization')).toBe('Bearer old-token');
  });

  it('should refresh once on a 401 and retry with the new token', async () => {
    const seen: (string | null)[] = [];
    const fetchMock = mockApi({
      'GET /api/things': ({ headers }) => {
        seen.push(headers.get('Authorization'));
        return headers.get('Authorization') === 'Bearer new-token' ? jsonResponse({ id: 7 }) : expired();
      },
      'POST /api/auth/refresh': () => jsonResponse(buildSessionResponse(user, 'new-token')),
    });

    const result = await apiRequest('/api/things', z.object({ id: z.number() }));

    expect(result).toEqual({ id: 7 });
    expect(seen).toEqual(['Bearer old-token', 'Bearer new-token']);
    expect(fetchMock.mock.calls.filter(([url]) => url === '/api/auth/refresh')).toHaveLength(1);
    expect(getAccessToken()).toBe('new-token');
  });

  it('should share one refresh between requests that meet a 401 at the same time', async () => {
    let refreshes = 0;
    mockApi({
      'GET /api/a': ({ headers }) => (headers.get('Authorization') === 'Bearer new-token' ? jsonResponse('a') : expired()),
      'GET /api/b': ({ headers }) => (headers.get('Authorization') === 'Bearer new-token' ? jsonResponse('b') : expired()),
      'POST /api/auth/refresh': async () => {
        refreshes += 1;
        await new Promise((resolve) => setTimeout(resolve, 10));
        return jsonResponse(buildSessionResponse(user, 'new-token'));
      },
    });

    const results = await Promise.all([apiRequest('/api/a'), apiRequest('/api/b'), refreshSession()]);

    expect(results.slice(0, 2)).toEqual(['a', 'b']);
    expect(refreshes).toBe(1);
  });

  it('should clear the session as expired and throw the 401 when the refresh is refused', async () => {
    const fetchMock = mockApi({
      'GET /api/things': expired,
      'POST /api/auth/refresh': () => apiErrorResponse(401, { message: 'Session ended.', code: 'SESSION_ENDED' }),
    });

    await expect(apiRequest('/api/things')).rejects.toMatchObject({ status: 401 });

    expect(getSessionState()).toEqual({ status: 'signed-out', reason: 'expired' });
    // No second try after the refresh failed.
    expect(fetchMock.mock.calls.filter(([url]) => url === '/api/things')).toHaveLength(1);
  });

  it('should not refresh for requests that opt out (sign-in itself)', async () => {
    const fetchMock = mockApi({
      'POST /api/auth/sign-in': () => apiErrorResponse(401, { message: 'No.', code: 'SIGN_IN_FAILED' }),
    });

    await expect(apiRequest('/api/auth/sign-in', undefined, { method: 'POST', auth: false })).rejects.toMatchObject({
      code: 'SIGN_IN_FAILED',
    });

    expect(fetchMock).toHaveBeenCalledTimes(1);
    expect(new Headers(fetchMock.mock.calls[0]?.[1]?.headers).get('Authorization')).toBeNull();
    expect(getSessionState().status).toBe('signed-in');
  });
});
