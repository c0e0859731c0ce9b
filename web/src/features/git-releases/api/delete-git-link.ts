import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { gitLinkQueryOptions } from './get-git-link';

/** DELETE /api/repositories/:id/git. */
export function deleteGitLink(repositoryId: number): Promise<void> {
  return api.delete<void>(`/repositories/${repositoryId}/git`);
}

/** Unlinks the repository (its snapshots stay). */
export function useDeleteGitLink(repositoryId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => deleteGitLink(repositoryId),
    onSuccess: () => queryClient.setQueryData(gitLinkQueryOptions(repositoryId).queryKey, { gitLink: null }),
  });
}
