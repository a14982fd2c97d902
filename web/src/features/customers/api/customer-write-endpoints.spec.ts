import { afterEach, describe, expect, it, vi } from 'vitest';

import { mockApi, type MockRequest } from '../../../testing/mock-api';
import { jsonResponse } from '../../../testing/render-app';

import { createCustomer } from './create-customer';
import { updateCustomer } from './update-customer';

const customer = {
  id: '3c1f0d2e-6a4b-4d8e-9f70-1a2b3c4d5e6f',
  name: 'Willowmere Residence',
  email: null,
  phone: null,
  notes: null,
  createdAt: '2026-03-02T08:00:00.000Z',
  updatedAt: '2026-03-02T08:00:00.000Z',
};

describe('customer write endpoints (one file per route)', () => {
  afterEach(() => vi.restoreAllMocks());

  it.each([
    ['create-customer', 'POST /api/customers', () => createCustomer({ name: 'Willowmere Residence' })],
    ['update-customer', 'PATCH /api/customers/c%2F1', () => updateCustomer({ id: 'c/1', input: { name: 'Willowmere Residence' } })],
  ])('%s should send its own route with the input as the body', async (_file, route, send) => {
    const seen: MockRequest[] = [];
    mockApi({
      [route]: (request) => {
        seen.push(request);
        return jsonResponse(customer);
      },
    });
    expect(await send()).toEqual(customer);
    expect(seen.map((request) => request.body)).toEqual([{ name: 'Willowmere Residence' }]);
  });
});
