import { queryOptions, useSuspenseQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { type UserResponse, UserResponseSchema } from '@domain/auth/auth.schema';

import { apiRequest } from '../../../lib/api-client';

export type { UserResponse };

export function getUsers({ signal }: { signal?: AbortSignal } = {}): Promise<UserResponse[]> {
  return apiRequest('/api/users', z.array(UserResponseSchema), { signal });
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
