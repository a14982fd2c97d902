import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CompanyDepthRulesResponse } from '@domain/company/company-profile.schema';

import { getDepthRulesQueryOptions } from './get-depth-rules';

/** A depth rules write (update-depth-rules, reset-depth-rules): its answer is the table now. */
export function useDepthRulesMutation<I>(send: (input: I) => Promise<CompanyDepthRulesResponse>) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: send,
    onSuccess: (rules) => queryClient.setQueryData(getDepthRulesQueryOptions().queryKey, rules),
  });
}
