import { queryOptions, useQuery } from '@tanstack/react-query';
import type { CustomerResponse } from '@domain/customers/customer.schema';

import { apiRequest } from '../../../lib/api-client';
import { responseOf } from '../../../lib/response';

export type { CustomerResponse };

export function getCustomers({ q }: { q?: string }, { signal }: { signal?: AbortSignal } = {}): Promise<CustomerResponse[]> {
  const query = q ? `?${new URLSearchParams({ q })}` : '';
  return apiRequest(`/api/customers${query}`, responseOf<CustomerResponse[]>(), { signal });
}

export function getCustomersQueryOptions({ q = '' }: { q?: string } = {}) {
  return queryOptions({
    queryKey: ['customers', 'list', { q }],
    queryFn: ({ signal }) => getCustomers({ q }, { signal }),
  });
}

export function useCustomers(params: { q?: string } = {}) {
  return useQuery(getCustomersQueryOptions(params));
}
