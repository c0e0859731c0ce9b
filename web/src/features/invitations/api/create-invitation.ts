import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { InvitationDTO, InviteUserInput } from '@shared/api/invitations';
import { api } from '@/lib/api-client';
import { invitationsQueryOptions } from './get-invitations';

/** POST /api/invitations. */
export function createInvitation(input: InviteUserInput): Promise<InvitationDTO> {
  return api.post<InvitationDTO>('/invitations', input);
}

/** Invites someone, then refetches the pending invitations. */
export function useCreateInvitation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createInvitation,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: invitationsQueryOptions().queryKey }),
  });
}
