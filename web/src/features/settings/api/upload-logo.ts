import { type CompanyProfileResponse, CompanyProfileResponseSchema } from '@domain/company/company-profile.schema';

import { apiRequest } from '../../../lib/api-client';

import { useProfileMutation } from './company-profile-mutation';

/** Uploads or replaces the logo (PUT /api/company/profile/logo; the server sniffs the bytes and stores a PNG). */
export function uploadLogo(file: File): Promise<CompanyProfileResponse> {
  const form = new FormData();
  form.append('file', file);
  return apiRequest('/api/company/profile/logo', CompanyProfileResponseSchema, { method: 'PUT', body: form, timeoutMs: 60_000 });
}

export function useUploadLogo() {
  return useProfileMutation(uploadLogo);
}
