import { LocateViewResponseSchema } from '@domain/locate/locate-link.schema';
import { afterEach, describe, expect, it, vi } from 'vitest';

import { isApiError } from '../../../lib/api-error';
import { apiErrorResponse, mockApi } from '../../../testing/mock-api';
import { jsonResponse } from '../../../testing/render-app';
import { buildLocateView } from '../testing-fixtures';
import { getLocateView, loadLocateView, unavailableReason } from './get-locate-view';

/*
 * The locate page's request goes through the public fetch (lib/public-api.ts), without zod or the session
 * (issue 17); the answer is still checked against the API's schema in development and tests.
 */
describe('getLocateView', () => {
  afterEach(() => vi.restoreAllMocks());

  it('should use a fixture the API’s schema accepts (the integration tests parse the real answer with it)', () => {
    expect(LocateViewResponseSchema.safeParse(buildLocateView('tok')).error).toBeUndefined();
  });

  it('should ask as the page’s Link preload does: JSON, credentials included, no bearer token', async () => {
    const fetchMock = mockApi({ 'GET /api/locate/a%2Fb': () => jsonResponse(buildLocateView('a/b')) });
    const view = await getLocateView('a/b');
    expect(view.installer.companyName).toBe('Garden Sound Co');
    expect(fetchMock).toHaveBeenCalledTimes(1);
    const init = fetchMock.mock.calls[0]![1]!;
    expect(init.credentials).toBe('include');
    expect(init.method ?? 'GET').toBe('GET');
    const headers = new Headers(init.headers);
    expect(headers.get('Accept')).toBe('application/json');
    expect(headers.has('Authorization')).toBe(false);
  });

  it('should refuse an answer that does not fit the schema in development and tests', async () => {
    const { installer: _installer, ...withoutInstaller } = buildLocateView('odd');
    mockApi({ 'GET /api/locate/odd': () => jsonResponse(withoutInstaller) });
    const error = await getLocateView('odd').catch((e: unknown) => e);
    expect(isApiError(error) && error.code).toBe('UNEXPECTED_RESPONSE');
    expect(unavailableReason(error)).toBe('error');
  });

  it('should fail with the status, code and message of the API’s error body', async () => {
    mockApi({ 'GET /api/locate/gone': () => apiErrorResponse(404, { message: 'This link is not valid.', code: 'LOCATE_LINK_NOT_VALID' }) });
    const error = await getLocateView('gone').catch((e: unknown) => e);
    expect(isApiError(error) && { status: error.status, code: error.code, message: error.message }).toEqual({ status: 404, code: 'LOCATE_LINK_NOT_VALID', message: 'This link is not valid.' });
    expect(unavailableReason(error)).toBe('not-valid');
  });

  it('should fail with status 0 when the server cannot be reached, and be tried twice more', async () => {
    const fetchMock = vi.spyOn(globalThis, 'fetch').mockRejectedValue(new TypeError('Failed to fetch'));
    const error = await loadLocateView('far', [0, 0]).catch((e: unknown) => e);
    expect(isApiError(error) && { status: error.status, code: error.code }).toEqual({ status: 0, code: 'NETWORK_ERROR' });
    expect(fetchMock).toHaveBeenCalledTimes(3);
  });

  it('should never try a refused link again (every open is logged, a miss counts towards the rate limit)', async () => {
    const fetchMock = mockApi({ 'GET /api/locate/busy': () => apiErrorResponse(429, { message: 'Too many requests.' }) });
    const error = await loadLocateView('busy', [0, 0]).catch((e: unknown) => e);
    expect(unavailableReason(error)).toBe('rate-limited');
    expect(fetchMock).toHaveBeenCalledTimes(1);
  });
});
