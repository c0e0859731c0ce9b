import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { invitationsQueryOptions } from './get-invitations';

/** DELETE /api/invitations/:id. */
export function revokeInvitation(id: string): Promise<void> {
  return api.delete<void>(`/invitations/${id}`);
}

/** Revokes a pending invitation, then refetches the list. */
export function useRevokeInvitation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: revokeInvitation,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: invitationsQueryOptions().queryKey }),
  });
}
