import { queryOptions, useQuery } from '@tanstack/react-query';
import { type MailStatusResponse, MailStatusResponseSchema } from '@domain/signup/signup.schema';

import { apiRequest } from '../../../lib/api-client';

/** Where mail goes (GET /api/outbox/status): captured by this server (the Outbox has it) or handed to a mail service. */
export function getMailStatus({ signal }: { signal?: AbortSignal } = {}): Promise<MailStatusResponse> {
  return apiRequest('/api/outbox/status', MailStatusResponseSchema, { signal });
}

export function getMailStatusQueryOptions() {
  return queryOptions({
    queryKey: ['outbox', 'status'],
    queryFn: ({ signal }) => getMailStatus({ signal }),
    staleTime: Infinity,
  });
}

export function useMailStatus(enabled = true) {
  return useQuery({ ...getMailStatusQueryOptions(), enabled });
}

/**
 * Whether to offer the Outbox at all: only to admins and office staff, and only when the server keeps
 * local mail. Asks `/api/outbox/status`, which always answers them (never a 404 to log).
 */
export function useHasOutbox(mayRead: boolean): boolean {
  const query = useMailStatus(mayRead);
  return mayRead && query.data?.captured === true;
}
