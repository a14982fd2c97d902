import { describe, expect, it, vi } from 'vitest';
import { z } from 'zod';

import { jsonResponse } from '../testing/render-app';

import { ApiError, apiRequest } from './api-client';

describe('apiRequest', () => {
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
