import { queryOptions, useSuspenseQuery } from '@tanstack/react-query';
import type { CustomerResponse } from '@domain/customers/customer.schema';

import { apiRequest } from '../../../lib/api-client';
import { responseOf } from '../../../lib/response';

export function getCustomer(customerId: string, { signal }: { signal?: AbortSignal } = {}): Promise<CustomerResponse> {
  return apiRequest(`/api/customers/${encodeURIComponent(customerId)}`, responseOf<CustomerResponse>(), { signal });
}

export function getCustomerQueryOptions(customerId: string) {
  return queryOptions({
    queryKey: ['customers', 'detail', customerId],
    queryFn: ({ signal }) => getCustomer(customerId, { signal }),
  });
}

export function useCustomer(customerId: string) {
  return useSuspenseQuery(getCustomerQueryOptions(customerId));
}
