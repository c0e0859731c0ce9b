import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreateApiTokenInput, CreatedApiTokenDTO } from '@shared/api/tokens';
import { api } from '@/lib/api-client';
import { apiTokensQueryOptions } from './get-api-tokens';

/** POST /api/tokens: the answer holds the secret, the only time it is ever sent. */
export function createApiToken(input: CreateApiTokenInput): Promise<CreatedApiTokenDTO> {
  return api.post<CreatedApiTokenDTO>('/tokens', input);
}

/** Creates a token, then refetches the list (which never holds a secret). */
export function useCreateApiToken() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createApiToken,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: apiTokensQueryOptions().queryKey }),
  });
}
