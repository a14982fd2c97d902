import { queryOptions, useQuery } from '@tanstack/react-query';
import { type CompanyDepthRulesResponse, CompanyDepthRulesResponseSchema } from '@domain/company/company-profile.schema';

import { apiRequest } from '../../../lib/api-client';

export type { CompanyDepthRulesResponse };

/** The company's depth rules table (GET /api/company/depth-rules). */
export function getDepthRules({ signal }: { signal?: AbortSignal } = {}): Promise<CompanyDepthRulesResponse> {
  return apiRequest('/api/company/depth-rules', CompanyDepthRulesResponseSchema, { signal });
}

export function getDepthRulesQueryOptions() {
  return queryOptions({
    queryKey: ['company', 'depth-rules'],
    queryFn: ({ signal }) => getDepthRules({ signal }),
  });
}

export function useDepthRules() {
  return useQuery(getDepthRulesQueryOptions());
}
