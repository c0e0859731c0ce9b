import { useState } from 'react';
import type { RepositoryDTO } from '@shared/api/repositories';
import { Button } from '@/components/button';
import { Notice, errorMessage } from '@/components/notice';
import { useDeleteRepository } from '@/features/repositories/api/delete-repository';

/** Delete, behind an explicit second step that names what goes. Calls onDeleted afterwards. */
export function DeleteRepository({ repository, onDeleted }: { repository: RepositoryDTO; onDeleted: () => void }) {
  const remove = useDeleteRepository();
  const [confirming, setConfirming] = useState(false);
  if (!confirming) {
    return (
      <Button variant="danger" onClick={() => setConfirming(true)}>
        Delete repository…
      </Button>
    );
  }
  return (
    <div className="space-y-3">
      {remove.isError ? <Notice tone="error">{errorMessage(remove.error)}</Notice> : null}
      <p className="text-sm">
        Delete <span className="font-mono font-semibold">{repository.name}</span> with all its snapshots, clone classes and
        trend? This cannot be undone.
      </p>
      <div className="flex gap-2">
        <Button variant="danger" className="border-danger" disabled={remove.isPending} onClick={() => remove.mutate(repository.id, { onSuccess: onDeleted })}>
          Delete for good
        </Button>
        <Button variant="secondary" disabled={remove.isPending} onClick={() => setConfirming(false)}>
          Keep it
        </Button>
      </div>
    </div>
  );
}
