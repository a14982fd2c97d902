import { queryOptions, useQuery } from '@tanstack/react-query';
import { type InvitationPreviewResponse, InvitationPreviewResponseSchema } from '@domain/auth/auth.schema';

import { apiRequest } from '../../../lib/api-client';

export type { InvitationPreviewResponse };

export function getInvitationPreview(token: string, { signal }: { signal?: AbortSignal } = {}) {
  return apiRequest(`/api/auth/invitations/${encodeURIComponent(token)}`, InvitationPreviewResponseSchema, {
    auth: false,
    signal,
  });
}

export function getInvitationPreviewQueryOptions(token: string) {
  return queryOptions({
    queryKey: ['auth', 'invitation', token],
    queryFn: ({ signal }) => getInvitationPreview(token, { signal }),
    retry: false,
    staleTime: Infinity,
  });
}

export function useInvitationPreview(token: string) {
  return useQuery(getInvitationPreviewQueryOptions(token));
}
