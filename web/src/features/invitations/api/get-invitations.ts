import { queryOptions, useQuery } from '@tanstack/react-query';
import type { InvitationListDTO } from '@shared/api/invitations';
import { api } from '@/lib/api-client';

/** GET /api/invitations: the pending ones. */
export function getInvitations(): Promise<InvitationListDTO> {
  return api.get<InvitationListDTO>('/invitations');
}

/** Query options of the pending invitations. */
export const invitationsQueryOptions = () => queryOptions({ queryKey: ['invitations'], queryFn: getInvitations });

/** The organisation's pending invitations (admins only). */
export function useInvitations() {
  return useQuery(invitationsQueryOptions());
}
