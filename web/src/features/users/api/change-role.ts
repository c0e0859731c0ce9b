import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ChangeRoleInput, UserDTO } from '@shared/api/users';
import { api } from '@/lib/api-client';
import { usersQueryOptions } from './get-users';

/** PUT /api/users/:id/role. */
export function changeRole({ id, ...input }: ChangeRoleInput & { id: string }): Promise<UserDTO> {
  return api.put<UserDTO>(`/users/${id}/role`, input);
}

/** Changes a user's role, then refetches the user list. */
export function useChangeRole() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: changeRole,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: usersQueryOptions().queryKey }),
  });
}
