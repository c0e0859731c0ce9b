import { queryOptions, useQuery } from '@tanstack/react-query';
import type { UserListDTO } from '@shared/api/users';
import { api } from '@/lib/api-client';

/** GET /api/users. */
export function getUsers(): Promise<UserListDTO> {
  return api.get<UserListDTO>('/users');
}

/** Query options of the user list. */
export const usersQueryOptions = () => queryOptions({ queryKey: ['users'], queryFn: getUsers });

/** The organisation's users (admins only). */
export function useUsers() {
  return useQuery(usersQueryOptions());
}
