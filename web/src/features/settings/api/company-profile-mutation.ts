import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CompanyProfileResponse } from '@domain/company/company-profile.schema';

import { getMyPreferencesQueryOptions } from '../../../lib/use-unit-preferences';

import { getCompanyProfileQueryOptions } from './get-company-profile';

/** A profile write (update-company-profile, upload-logo, remove-logo): its answer is the new profile. */
export function useProfileMutation<I>(send: (input: I) => Promise<CompanyProfileResponse>) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: send,
    onSuccess: (profile) => {
      queryClient.setQueryData(getCompanyProfileQueryOptions().queryKey, profile);
      // Everyone's preferences carry the company's time zone and locale, in which screens write dates.
      void queryClient.invalidateQueries({ queryKey: getMyPreferencesQueryOptions().queryKey });
    },
  });
}
