import { useMutation, useQueryClient } from '@tanstack/react-query';
import { type CreateCustomerInput, type CustomerResponse, CustomerResponseSchema } from '@domain/customers/customer.schema';

import { apiRequest } from '../../../lib/api-client';

import { customerKeys } from './customer-keys';

/** Creates a customer (POST /api/customers). */
export function createCustomer(input: CreateCustomerInput): Promise<CustomerResponse> {
  return apiRequest('/api/customers', CustomerResponseSchema, { method: 'POST', body: input });
}

export function useCreateCustomer() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createCustomer,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: customerKeys.all }),
  });
}
