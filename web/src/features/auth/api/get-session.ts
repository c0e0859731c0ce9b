import { queryOptions, useQuery } from '@tanstack/react-query';
import type { SessionDTO } from '@shared/api/session';
import { api, setCsrfToken } from '@/lib/api-client';

/** GET /api/session: the signed-in user (or null) and the CSRF token, which the api client keeps. */
export async function getSession(): Promise<SessionDTO> {
  const session = await api.get<SessionDTO>('/session');
  setCsrfToken(session.csrfToken);
  return session;
}

/** Query options of the session; every other key that depends on who is signed in starts elsewhere. */
export const sessionQueryOptions = () =>
  queryOptions({ queryKey: ['session'], queryFn: getSession, staleTime: 60_000 });

/** The current session. */
export function useSession() {
  return useQuery(sessionQueryOptions());
}
