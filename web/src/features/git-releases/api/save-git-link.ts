import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { GitLinkAnswerDTO, GitLinkInput } from '@shared/api/git-links';
import { api } from '@/lib/api-client';
import { gitLinkQueryOptions } from './get-git-link';

/** PUT /api/repositories/:id/git. */
export function saveGitLink({ repositoryId, ...input }: GitLinkInput & { repositoryId: number }): Promise<GitLinkAnswerDTO> {
  return api.put<GitLinkAnswerDTO>(`/repositories/${repositoryId}/git`, input);
}

/** Links the repository to a remote (or changes the link). */
export function useSaveGitLink(repositoryId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: GitLinkInput) => saveGitLink({ repositoryId, ...input }),
    onSuccess: (answer) => queryClient.setQueryData(gitLinkQueryOptions(repositoryId).queryKey, answer),
  });
}
