import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { AcceptInvitationInput } from '@shared/api/invitations';
import type { UserDTO } from '@shared/api/users';
import { api } from '@/lib/api-client';
import { invitationPreviewQueryOptions } from './get-invitation-preview';

/** POST /api/invitations/token/:token/accept. */
export function acceptInvitation({ token, ...input }: AcceptInvitationInput & { token: string }): Promise<UserDTO> {
  return api.post<UserDTO>(`/invitations/token/${encodeURIComponent(token)}/accept`, input);
}

/** Accepts an invitation; the link is spent, so its preview is dropped. */
export function useAcceptInvitation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: acceptInvitation,
    onSuccess: (_user, { token }) =>
      queryClient.removeQueries({ queryKey: invitationPreviewQueryOptions(token).queryKey }),
  });
}
