import { queryOptions, useSuspenseQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { type InvitationResponse, InvitationResponseSchema } from '@domain/auth/auth.schema';

import { apiRequest } from '../../../lib/api-client';

export type { InvitationResponse };

/** Invitations not yet accepted, revoked or expired. */
export function getInvitations({ signal }: { signal?: AbortSignal } = {}): Promise<InvitationResponse[]> {
  return apiRequest('/api/invitations', z.array(InvitationResponseSchema), { signal });
}

/** While an invitation e-mail waits in the send queue, look again now and then to show when it went (or failed). */
const WAITING_MAIL_REFETCH_MS = 5_000;

export function getInvitationsQueryOptions() {
  return queryOptions({
    queryKey: ['invitations', 'list'],
    queryFn: ({ signal }) => getInvitations({ signal }),
    refetchInterval: (query) =>
      query.state.data?.some((i) => i.mail?.status === 'queued' || i.mail?.status === 'sending') ? WAITING_MAIL_REFETCH_MS : false,
  });
}

export function useInvitations() {
  return useSuspenseQuery(getInvitationsQueryOptions());
}
