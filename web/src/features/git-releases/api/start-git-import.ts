import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { GitImportAnswerDTO } from '@shared/api/git-links';
import { api } from '@/lib/api-client';
import { gitLinkQueryOptions } from './get-git-link';

/** POST /api/repositories/:id/git/import: "Import releases" / "Check for new tags". */
export function startGitImport(repositoryId: number): Promise<GitImportAnswerDTO> {
  return api.post<GitImportAnswerDTO>(`/repositories/${repositoryId}/git/import`);
}

/** Queues an import; the link's query then follows it until it ends. */
export function useStartGitImport(repositoryId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => startGitImport(repositoryId),
    onSuccess: ({ gitLink }) => queryClient.setQueryData(gitLinkQueryOptions(repositoryId).queryKey, { gitLink }),
  });
}
