import { useMutation, useQueryClient } from '@tanstack/react-query';
import { type CompanySettingsResponse, CompanySettingsResponseSchema, type UpdateCompanySettingsInput } from '@domain/settings/settings.schema';

import { apiRequest } from '../../../lib/api-client';
import { getMyPreferencesQueryOptions } from '../../../lib/use-unit-preferences';

import { getCompanySettingsQueryOptions } from './get-company-settings';

/** Changes the company's defaults (admin only). */
export function updateCompanySettings(input: UpdateCompanySettingsInput): Promise<CompanySettingsResponse> {
  return apiRequest('/api/company/settings', CompanySettingsResponseSchema, { method: 'PATCH', body: input });
}

export function useUpdateCompanySettings() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateCompanySettings,
    onSuccess: (settings) => {
      queryClient.setQueryData(getCompanySettingsQueryOptions().queryKey, settings);
      // The admin's own effective units follow a new default unless they chose their own.
      return queryClient.invalidateQueries({ queryKey: getMyPreferencesQueryOptions().queryKey });
    },
  });
}
