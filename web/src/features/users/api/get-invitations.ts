import { queryOptions, useSuspenseQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { type InvitationResponse, InvitationResponseSchema } from '@domain/auth/auth.schema';

import { apiRequest } from '../../../lib/api-client';

export type { InvitationResponse };

/** Invitations not yet accepted, revoked or expired. */
export function getInvitations({ signal }: { signal?: AbortSignal } = {}): Promise<InvitationResponse[]> {
  return apiRequest('/api/invitations', z.array(InvitationResponseSchema), { signal });
}

export function getInvitationsQueryOptions() {
  return queryOptions({
    queryKey: ['invitations', 'list'],
    queryFn: ({ signal }) => getInvitations({ signal }),
  });
}

export function useInvitations() {
  return useSuspenseQuery(getInvitationsQueryOptions());
}
