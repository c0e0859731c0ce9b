import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { WaiveClassInput, WaiverCreatedDTO } from '@shared/api/snapshots';
import { api } from '@/lib/api-client';

/** POST /api/clone-classes/:id/waiver: waives the class's lineage. */
export function waiveCloneClass(id: number, input: WaiveClassInput): Promise<WaiverCreatedDTO> {
  return api.post<WaiverCreatedDTO>(`/clone-classes/${id}/waiver`, input);
}

/** DELETE /api/clone-classes/:id/waiver: lifts the lineage's waiver. */
export function liftCloneClassWaiver(id: number): Promise<void> {
  return api.delete<void>(`/clone-classes/${id}/waiver`);
}

/**
 * Waives or lifts, then refetches every class view, snapshot and repository: lists, counts, both
 * ratios and the budget verdict all change with a waiver.
 */
export function useCloneClassWaiver(id: number) {
  const queryClient = useQueryClient();
  const refresh = () => Promise.all(['clone-classes', 'snapshots', 'repositories'].map((key) => queryClient.invalidateQueries({ queryKey: [key] })));
  const waive = useMutation({ mutationFn: (input: WaiveClassInput) => waiveCloneClass(id, input), onSuccess: refresh });
  const lift = useMutation({ mutationFn: () => liftCloneClassWaiver(id), onSuccess: refresh });
  return { waive, lift };
}
