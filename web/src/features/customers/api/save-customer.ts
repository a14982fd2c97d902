import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreateCustomerInput, CustomerResponse, UpdateCustomerInput } from '@domain/customers/customer.schema';

import { apiRequest } from '../../../lib/api-client';
import { responseOf } from '../../../lib/response';

/** Creates a customer (no `id`) or changes one. */
export function saveCustomer({ id, input }: { id?: string; input: CreateCustomerInput | UpdateCustomerInput }): Promise<CustomerResponse> {
  return apiRequest(id ? `/api/customers/${encodeURIComponent(id)}` : '/api/customers', responseOf<CustomerResponse>(), {
    method: id ? 'PATCH' : 'POST',
    body: input,
  });
}

export function useSaveCustomer() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: saveCustomer,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: ['customers'] }),
  });
}
