import { queryOptions, useQuery } from '@tanstack/react-query';
import type { InvitationPreviewDTO } from '@shared/api/invitations';
import { api } from '@/lib/api-client';

/** GET /api/invitations/token/:token. */
export function getInvitationPreview(token: string): Promise<InvitationPreviewDTO> {
  return api.get<InvitationPreviewDTO>(`/invitations/token/${encodeURIComponent(token)}`);
}

/** Query options of what a one-time link offers. */
export const invitationPreviewQueryOptions = (token: string) =>
  queryOptions({ queryKey: ['invitations', 'token', token], queryFn: () => getInvitationPreview(token) });

/** What the one-time link offers (public). */
export function useInvitationPreview(token: string) {
  return useQuery(invitationPreviewQueryOptions(token));
}
