import { type CompanyProfileResponse, CompanyProfileResponseSchema, type UpdateCompanyProfileInput } from '@domain/company/company-profile.schema';

import { apiRequest } from '../../../lib/api-client';

import { useProfileMutation } from './company-profile-mutation';

/** Changes the profile (PATCH /api/company/profile, admin only). */
export function updateCompanyProfile(input: UpdateCompanyProfileInput): Promise<CompanyProfileResponse> {
  return apiRequest('/api/company/profile', CompanyProfileResponseSchema, { method: 'PATCH', body: input });
}

export function useUpdateCompanyProfile() {
  return useProfileMutation(updateCompanyProfile);
}
