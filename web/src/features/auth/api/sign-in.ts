import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { SessionDTO, SignInInput } from '@shared/api/session';
import { api, setCsrfToken } from '@/lib/api-client';
import { sessionQueryOptions } from './get-session';

/** POST /api/session. */
export async function signIn(input: SignInInput): Promise<SessionDTO> {
  const session = await api.post<SessionDTO>('/session', input);
  setCsrfToken(session.csrfToken);
  return session;
}

/** Signs in; the new session replaces the cached one and everything else is refetched as the new user. */
export function useSignIn() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: signIn,
    onSuccess: (session) => {
      queryClient.removeQueries({ predicate: (q) => q.queryKey[0] !== 'session' });
      queryClient.setQueryData(sessionQueryOptions().queryKey, session);
    },
  });
}
