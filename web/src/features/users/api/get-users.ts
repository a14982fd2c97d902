import { queryOptions, useSuspenseQuery } from '@tanstack/react-query';
import { type UserResponse, UserListResponseSchema } from '@domain/auth/auth.schema';

import { apiRequest } from '../../../lib/api-client';
import { fetchAllPages, pageQuery } from '../../../lib/pages';

export type { UserResponse };

/** Everyone in the company, page by page: the users table and the crew and homeowner pickers show all. */
export function getUsers({ signal }: { signal?: AbortSignal } = {}): Promise<UserResponse[]> {
  return fetchAllPages((cursor, pageSize) => apiRequest(`/api/users${pageQuery({ cursor, pageSize })}`, UserListResponseSchema, { signal }));
}

export function getUsersQueryOptions() {
  return queryOptions({
    queryKey: ['users', 'list'],
    queryFn: ({ signal }) => getUsers({ signal }),
  });
}

export function useUsers() {
  return useSuspenseQuery(getUsersQueryOptions());
}
