import { type CompanyDepthRulesResponse, CompanyDepthRulesResponseSchema, type UpdateDepthRulesInput } from '@domain/company/company-profile.schema';

import { apiRequest } from '../../../lib/api-client';

import { useDepthRulesMutation } from './depth-rules-mutation';

/** Replaces the company's depth rules table (PUT /api/company/depth-rules). */
export function updateDepthRules(table: UpdateDepthRulesInput): Promise<CompanyDepthRulesResponse> {
  return apiRequest('/api/company/depth-rules', CompanyDepthRulesResponseSchema, { method: 'PUT', body: table });
}

export function useUpdateDepthRules() {
  return useDepthRulesMutation(updateDepthRules);
}
