import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { CustomerPageSchema, type CustomerResponse } from '@domain/customers/customer.schema';

import { apiRequest } from '../../../lib/api-client';
import { type CursorPage, pageQuery } from '../../../lib/pages';

import { customerKeys } from './customer-keys';

export type { CustomerResponse };

export type CustomerListParams = { q?: string; page?: number };

/** One page of the company's customers (25 a page), matching `q`. */
export function getCustomers({ q, page = 1 }: CustomerListParams, { signal }: { signal?: AbortSignal } = {}): Promise<CursorPage<CustomerResponse>> {
  return apiRequest(`/api/customers${pageQuery({ q, page: page > 1 ? page : undefined })}`, CustomerPageSchema, { signal });
}

export function getCustomersQueryOptions({ q = '', page = 1 }: CustomerListParams = {}) {
  return queryOptions({
    queryKey: customerKeys.list({ q, page }),
    queryFn: ({ signal }) => getCustomers({ q, page }, { signal }),
    // The page stays on screen while the next one loads.
    placeholderData: keepPreviousData,
  });
}

export function useCustomers(params: CustomerListParams = {}) {
  return useQuery(getCustomersQueryOptions(params));
}
