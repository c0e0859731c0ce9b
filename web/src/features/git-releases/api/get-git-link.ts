import { queryOptions, useQuery } from '@tanstack/react-query';
import type { GitLinkAnswerDTO } from '@shared/api/git-links';
import { api } from '@/lib/api-client';

/** GET /api/repositories/:id/git. */
export function getGitLink(repositoryId: number): Promise<GitLinkAnswerDTO> {
  return api.get<GitLinkAnswerDTO>(`/repositories/${repositoryId}/git`);
}

/** Query options of a repository's git link (under the repository's key, so its invalidation refreshes it). */
export const gitLinkQueryOptions = (repositoryId: number) =>
  queryOptions({
    queryKey: ['repositories', repositoryId, 'git'],
    queryFn: () => getGitLink(repositoryId),
    // While an import is queued or running, follow it.
    refetchInterval: (query) => {
      const status = query.state.data?.gitLink?.lastImport?.status;
      return status === 'queued' || status === 'running' ? 2000 : false;
    },
  });

/** A repository's git link and its last import, polled while an import is under way. */
export function useGitLink(repositoryId: number) {
  return useQuery(gitLinkQueryOptions(repositoryId));
}
