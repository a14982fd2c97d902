import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useEffect, useState } from 'react';
import {
  type CompanyDepthRulesResponse,
  CompanyDepthRulesResponseSchema,
  type CompanyProfileResponse,
  CompanyProfileResponseSchema,
  type UpdateCompanyProfileInput,
  type UpdateDepthRulesInput,
} from '@domain/company/company-profile.schema';

import { apiBlob, apiRequest } from '../../../lib/api-client';
import { getMyPreferencesQueryOptions } from '../../../lib/use-unit-preferences';

export type { CompanyDepthRulesResponse, CompanyProfileResponse };

export function getCompanyProfileQueryOptions() {
  return queryOptions({
    queryKey: ['company', 'profile'],
    queryFn: ({ signal }) => apiRequest('/api/company/profile', CompanyProfileResponseSchema, { signal }),
  });
}

export function getDepthRulesQueryOptions() {
  return queryOptions({
    queryKey: ['company', 'depth-rules'],
    queryFn: ({ signal }) => apiRequest('/api/company/depth-rules', CompanyDepthRulesResponseSchema, { signal }),
  });
}

export function useCompanyProfile() {
  return useQuery(getCompanyProfileQueryOptions());
}

export function useDepthRules() {
  return useQuery(getDepthRulesQueryOptions());
}

function useProfileMutation<I>(send: (input: I) => Promise<CompanyProfileResponse>) {
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

/** Changes the profile (admin only). */
export function useUpdateCompanyProfile() {
  return useProfileMutation((input: UpdateCompanyProfileInput) =>
    apiRequest('/api/company/profile', CompanyProfileResponseSchema, { method: 'PATCH', body: input }),
  );
}

/** Uploads or replaces the logo (the server sniffs the bytes and stores a PNG). */
export function useUploadLogo() {
  return useProfileMutation((file: File) => {
    const form = new FormData();
    form.append('file', file);
    return apiRequest('/api/company/profile/logo', CompanyProfileResponseSchema, { method: 'PUT', body: form, timeoutMs: 60_000 });
  });
}

export function useRemoveLogo() {
  return useProfileMutation(() => apiRequest('/api/company/profile/logo', CompanyProfileResponseSchema, { method: 'DELETE' }));
}

/** An object URL of the stored logo (fetched with the session, so an <img> can show it); revoked when it changes. */
export function useLogoUrl(url: string | undefined): string | undefined {
  const [objectUrl, setObjectUrl] = useState<string | undefined>();
  useEffect(() => {
    if (!url) {
      setObjectUrl(undefined);
      return;
    }
    let isCurrent = true;
    let created: string | undefined;
    apiBlob(url)
      .then((blob) => {
        if (!isCurrent) return;
        created = URL.createObjectURL(blob);
        setObjectUrl(created);
      })
      .catch(() => isCurrent && setObjectUrl(undefined));
    return () => {
      isCurrent = false;
      if (created) URL.revokeObjectURL(created);
    };
  }, [url]);
  return objectUrl;
}

function useDepthRulesMutation<I>(send: (input: I) => Promise<CompanyDepthRulesResponse>) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: send,
    onSuccess: (rules) => queryClient.setQueryData(getDepthRulesQueryOptions().queryKey, rules),
  });
}

export function useUpdateDepthRules() {
  return useDepthRulesMutation((table: UpdateDepthRulesInput) =>
    apiRequest('/api/company/depth-rules', CompanyDepthRulesResponseSchema, { method: 'PUT', body: table }),
  );
}

export function useResetDepthRules() {
  return useDepthRulesMutation(() => apiRequest('/api/company/depth-rules', CompanyDepthRulesResponseSchema, { method: 'DELETE' }));
}
