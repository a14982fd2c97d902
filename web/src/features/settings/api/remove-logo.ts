import { type CompanyProfileResponse, CompanyProfileResponseSchema } from '@domain/company/company-profile.schema';

import { apiRequest } from '../../../lib/api-client';

import { useProfileMutation } from './company-profile-mutation';

/** Removes the logo (DELETE /api/company/profile/logo). */
export function removeLogo(): Promise<CompanyProfileResponse> {
  return apiRequest('/api/company/profile/logo', CompanyProfileResponseSchema, { method: 'DELETE' });
}

export function useRemoveLogo() {
  return useProfileMutation(removeLogo);
}
