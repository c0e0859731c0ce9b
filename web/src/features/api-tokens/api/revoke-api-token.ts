import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { apiTokensQueryOptions } from './get-api-tokens';

/** DELETE /api/tokens/:id. */
export function revokeApiToken(id: number): Promise<void> {
  return api.delete<void>(`/tokens/${id}`);
}

/** Revokes a token, then refetches the list. */
export function useRevokeApiToken() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: revokeApiToken,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: apiTokensQueryOptions().queryKey }),
  });
}
