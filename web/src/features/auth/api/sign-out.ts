import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { SessionDTO } from '@shared/api/session';
import { api, setCsrfToken } from '@/lib/api-client';
import { sessionQueryOptions } from './get-session';

/** DELETE /api/session. */
export async function signOut(): Promise<SessionDTO> {
  const session = await api.delete<SessionDTO>('/session');
  setCsrfToken(session.csrfToken);
  return session;
}

/** Signs out and forgets every cached answer of the previous user. */
export function useSignOut() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: signOut,
    onSuccess: (session) => {
      queryClient.removeQueries({ predicate: (q) => q.queryKey[0] !== 'session' });
      queryClient.setQueryData(sessionQueryOptions().queryKey, session);
    },
  });
}
