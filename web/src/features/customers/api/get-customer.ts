import { queryOptions, useSuspenseQuery } from '@tanstack/react-query';
import { type CustomerResponse, CustomerResponseSchema } from '@domain/customers/customer.schema';

import { apiRequest } from '../../../lib/api-client';

import { customerKeys } from './customer-keys';

export function getCustomer(customerId: string, { signal }: { signal?: AbortSignal } = {}): Promise<CustomerResponse> {
  return apiRequest(`/api/customers/${encodeURIComponent(customerId)}`, CustomerResponseSchema, { signal });
}

export function getCustomerQueryOptions(customerId: string) {
  return queryOptions({
    queryKey: customerKeys.detail(customerId),
    queryFn: ({ signal }) => getCustomer(customerId, { signal }),
  });
}

export function useCustomer(customerId: string) {
  return useSuspenseQuery(getCustomerQueryOptions(customerId));
}
