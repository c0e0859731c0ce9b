import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { UserDTO } from '@shared/api/users';
import { api } from '@/lib/api-client';
import { usersQueryOptions } from './get-users';

/** POST /api/users/:id/deactivate. */
export function deactivateUser(id: string): Promise<UserDTO> {
  return api.post<UserDTO>(`/users/${id}/deactivate`);
}

/** Deactivates a user, then refetches the user list. */
export function useDeactivateUser() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: deactivateUser,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: usersQueryOptions().queryKey }),
  });
}
