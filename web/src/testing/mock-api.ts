import { vi } from 'vitest';

import { jsonResponse } from './render-app';

export type MockRequest = { method: string; path: string; headers: Headers; body: unknown };
type Handler = (request: MockRequest) => Response | Promise<Response>;

/**
 * Answers `fetch` by "METHOD /path" (the path with its query string). An unlisted request fails the
 * test with a 599 answer naming it, so a missing handler is easy to spot. Returns the spy.
 */
export function mockApi(routes: Record<string, Handler>) {
  return vi.spyOn(globalThis, 'fetch').mockImplementation(async (input, init) => {
    const url = new URL(typeof input === 'string' ? input : input instanceof URL ? input.href : input.url, 'http://localhost');
    const method = (init?.method ?? 'GET').toUpperCase();
    const path = `${url.pathname}${url.search}`;
    const handler = routes[`${method} ${path}`];
    if (!handler) return jsonResponse({ statusCode: 599, message: `no mock for ${method} ${path}` }, 599);
    const body = typeof init?.body === 'string' ? (JSON.parse(init.body) as unknown) : undefined;
    return handler({ method, path, headers: new Headers(init?.headers), body });
  });
}

/** An error body as the API sends it. */
export function apiErrorResponse(status: number, body: { message: string; code?: string; issues?: unknown[]; [field: string]: unknown }) {
  return jsonResponse({ statusCode: status, error: 'Error', ...body }, status);
}
