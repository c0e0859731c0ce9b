import { useMutation } from '@tanstack/react-query';
import type { ChangePasswordInput } from '@shared/api/session';
import { api } from '@/lib/api-client';

/** PUT /api/session/password. */
export function changePassword(input: ChangePasswordInput): Promise<void> {
  return api.put<void>('/session/password', input);
}

/** Changes the signed-in user's password (no cached key holds it, so nothing to invalidate). */
export function useChangePassword() {
  return useMutation({ mutationFn: changePassword });
}
