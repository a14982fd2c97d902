import { queryOptions, useQuery } from '@tanstack/react-query';
import { type CompanyProfileResponse, CompanyProfileResponseSchema } from '@domain/company/company-profile.schema';

import { apiRequest } from '../../../lib/api-client';

export type { CompanyProfileResponse };

/** The company's profile: name, contact, logo, time zone and locale (GET /api/company/profile). */
export function getCompanyProfile({ signal }: { signal?: AbortSignal } = {}): Promise<CompanyProfileResponse> {
  return apiRequest('/api/company/profile', CompanyProfileResponseSchema, { signal });
}

export function getCompanyProfileQueryOptions() {
  return queryOptions({
    queryKey: ['company', 'profile'],
    queryFn: ({ signal }) => getCompanyProfile({ signal }),
  });
}

export function useCompanyProfile() {
  return useQuery(getCompanyProfileQueryOptions());
}
