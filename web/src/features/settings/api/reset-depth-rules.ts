import { type CompanyDepthRulesResponse, CompanyDepthRulesResponseSchema } from '@domain/company/company-profile.schema';

import { apiRequest } from '../../../lib/api-client';

import { useDepthRulesMutation } from './depth-rules-mutation';

/** Goes back to the shipped default depth rules (DELETE /api/company/depth-rules). */
export function resetDepthRules(): Promise<CompanyDepthRulesResponse> {
  return apiRequest('/api/company/depth-rules', CompanyDepthRulesResponseSchema, { method: 'DELETE' });
}

export function useResetDepthRules() {
  return useDepthRulesMutation(resetDepthRules);
}
