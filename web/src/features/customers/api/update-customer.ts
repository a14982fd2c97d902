import { useMutation, useQueryClient } from '@tanstack/react-query';
import { type CustomerResponse, CustomerResponseSchema, type UpdateCustomerInput } from '@domain/customers/customer.schema';

import { apiRequest } from '../../../lib/api-client';

import { customerKeys } from './customer-keys';

/** Changes a customer (PATCH /api/customers/:id). */
export function updateCustomer({ id, input }: { id: string; input: UpdateCustomerInput }): Promise<CustomerResponse> {
  return apiRequest(`/api/customers/${encodeURIComponent(id)}`, CustomerResponseSchema, { method: 'PATCH', body: input });
}

export function useUpdateCustomer() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateCustomer,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: customerKeys.all }),
  });
}
