import { queryOptions, useQuery } from '@tanstack/react-query';
import type { MemberListDTO } from '@shared/api/tasks';
import { api } from '@/lib/api-client';

/** GET /api/members: the organisation's active members (a lead's list of people to assign). */
export function getMembers(): Promise<MemberListDTO> {
  return api.get<MemberListDTO>('/members');
}

/** Query options of the member list. */
export const membersQueryOptions = () => queryOptions({ queryKey: ['members'], queryFn: getMembers, staleTime: 60_000 });

/** The organisation's active members; only leads and admins may read them, so others pass enabled: false. */
export function useMembers(options: { enabled?: boolean } = {}) {
  return useQuery({ ...membersQueryOptions(), enabled: options.enabled ?? true });
}
