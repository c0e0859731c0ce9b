import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { SnapshotAnswerDTO } from '@shared/api/snapshots';
import { api } from '@/lib/api-client';

/** What the upload form sends. */
export interface UploadSnapshotVariables {
  repositoryId: number;
  label: string;
  archive: File;
}

/** POST /api/repositories/:id/snapshots (multipart: label, archive). */
export function uploadSnapshot({ repositoryId, label, archive }: UploadSnapshotVariables): Promise<SnapshotAnswerDTO> {
  const form = new FormData();
  form.append('label', label);
  form.append('archive', archive, archive.name);
  return api.postForm<SnapshotAnswerDTO>(`/repositories/${repositoryId}/snapshots`, form);
}

/** Uploads a release; its progress starts from the answer (queued) at once, and the repository's snapshots are refetched. */
export function useUploadSnapshot() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: uploadSnapshot,
    onSuccess: ({ snapshot }, { repositoryId }) => {
      queryClient.setQueryData(['snapshots', snapshot.id], snapshot);
      return queryClient.invalidateQueries({ queryKey: ['repositories', repositoryId] });
    },
  });
}
