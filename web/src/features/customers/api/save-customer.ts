import { useMutation, useQueryClient } from '@tanstack/react-query';
import { type CreateCustomerInput, type CustomerResponse, CustomerResponseSchema, type UpdateCustomerInput } from '@domain/customers/customer.schema';

import { apiRequest } from '../../../lib/api-client';

import { customerKeys } from './customer-keys';

/** Creates a customer (no `id`) or changes one. */
export function saveCustomer({ id, input }: { id?: string; input: CreateCustomerInput | UpdateCustomerInput }): Promise<CustomerResponse> {
  return apiRequest(id ? `/api/customers/${encodeURIComponent(id)}` : '/api/customers', CustomerResponseSchema, {
    method: id ? 'PATCH' : 'POST',
    body: input,
  });
}

export function useSaveCustomer() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: saveCustomer,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: customerKeys.all }),
  });
}
