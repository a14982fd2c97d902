import { useMutation, useQueryClient } from '@tanstack/react-query';
import { type UpdateUserInput, type UserResponse, UserResponseSchema } from '@domain/auth/auth.schema';

import { apiRequest } from '../../../lib/api-client';

import { getUsersQueryOptions } from './get-users';

export function updateUser({ id, changes }: { id: string; changes: UpdateUserInput }): Promise<UserResponse> {
  return apiRequest(`/api/users/${encodeURIComponent(id)}`, UserResponseSchema, { method: 'PATCH', body: changes });
}

export function useUpdateUser() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateUser,
    onSuccess: (updated) => {
      queryClient.setQueryData(getUsersQueryOptions().queryKey, (users) =>
        users?.map((user) => (user.id === updated.id ? updated : user)),
      );
      return queryClient.invalidateQueries({ queryKey: getUsersQueryOptions().queryKey });
    },
  });
}
