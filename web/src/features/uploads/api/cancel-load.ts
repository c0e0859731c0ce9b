import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { SnapshotAnswerDTO } from '@shared/api/snapshots';
import { api } from '@/lib/api-client';

/** POST /api/snapshots/:id/cancel. */
export function cancelLoad(id: number): Promise<SnapshotAnswerDTO> {
  return api.post<SnapshotAnswerDTO>(`/snapshots/${id}/cancel`);
}

/** Cancels a queued or running load, then shows the snapshot as the answer has it. */
export function useCancelLoad() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: cancelLoad,
    onSuccess: ({ snapshot }) => {
      queryClient.setQueryData(['snapshots', snapshot.id], snapshot);
      return queryClient.invalidateQueries({ queryKey: ['repositories', snapshot.repositoryId] });
    },
  });
}
