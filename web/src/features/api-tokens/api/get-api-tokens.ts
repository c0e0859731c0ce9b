import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ApiTokenListDTO } from '@shared/api/tokens';
import { api } from '@/lib/api-client';

/** GET /api/tokens. */
export function getApiTokens(): Promise<ApiTokenListDTO> {
  return api.get<ApiTokenListDTO>('/tokens');
}

/** Query options of the organisation's API tokens. */
export const apiTokensQueryOptions = () => queryOptions({ queryKey: ['api-tokens'], queryFn: getApiTokens });

/** The organisation's API tokens, revoked ones included (leads only). */
export function useApiTokens() {
  return useQuery(apiTokensQueryOptions());
}
