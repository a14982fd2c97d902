import { queryOptions, useSuspenseQuery } from '@tanstack/react-query';
import { type CompanySettingsResponse, CompanySettingsResponseSchema } from '@domain/settings/settings.schema';

import { apiRequest } from '../../../lib/api-client';

export type { CompanySettingsResponse };

export function getCompanySettings({ signal }: { signal?: AbortSignal } = {}): Promise<CompanySettingsResponse> {
  return apiRequest('/api/company/settings', CompanySettingsResponseSchema, { signal });
}

export function getCompanySettingsQueryOptions() {
  return queryOptions({
    queryKey: ['company', 'settings'],
    queryFn: ({ signal }) => getCompanySettings({ signal }),
  });
}

export function useCompanySettings() {
  return useSuspenseQuery(getCompanySettingsQueryOptions());
}
