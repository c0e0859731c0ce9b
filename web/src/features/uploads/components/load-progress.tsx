import { useEffect } from 'react';
import { Link } from 'react-router-dom';
import { useQueryClient } from '@tanstack/react-query';
import { isLoadActive, type SnapshotDTO } from '@shared/api/snapshots';
import { Button } from '@/components/button';
import { Notice, errorMessage } from '@/components/notice';
import { useCancelLoad } from '@/features/uploads/api/cancel-load';
import { useLoad } from '@/features/uploads/api/get-load';

/** The phase of a load in words, with its counts. */
export function phaseText(snapshot: SnapshotDTO): string {
  if (snapshot.status === 'queued') return 'Waiting for a worker';
  const p = snapshot.progress;
  if (!p) return 'Starting';
  switch (p.phase) {
    case 'unpacking':
      return 'Unpacking the archive';
    case 'analysing':
      return `Analysing ${p.done} of ${p.total} files`;
    case 'indexing':
      return `Indexing ${p.done} of ${p.total} sets`;
    case 'deriving':
      return 'Deriving clone classes';
  }
}

/** How far along the bar is, 0–100: each phase its share, counts within it. */
function percent(snapshot: SnapshotDTO): number {
  const p = snapshot.progress;
  if (snapshot.status === 'queued' || !p) return 0;
  const within = p.total > 0 ? p.done / p.total : 0;
  const [start, width] = { unpacking: [0, 10], analysing: [10, 60], indexing: [70, 20], deriving: [90, 10] }[p.phase];
  return Math.round(start + width * within);
}

/**
 * One load followed to its end: a progress bar with the phase and counts while it is queued or
 * running (polled every second), then a link to the ready snapshot, the failure reason in words, or
 * "cancelled". `mayCancel`: a lead, or the person who started it.
 */
export function LoadProgress({ snapshotId, mayCancel }: { snapshotId: number; mayCancel: (snapshot: SnapshotDTO) => boolean }) {
  const load = useLoad(snapshotId);
  const cancel = useCancelLoad();
  const queryClient = useQueryClient();
  const snapshot = load.data;
  const active = snapshot ? isLoadActive(snapshot.status) : true;
  const repositoryId = snapshot?.repositoryId;

  // When the load ends, the repository's snapshot list, trend and header change with it.
  useEffect(() => {
    if (!active && repositoryId !== undefined) void queryClient.invalidateQueries({ queryKey: ['repositories', repositoryId] });
  }, [active, repositoryId, queryClient]);

  if (!snapshot) return load.isError ? <Notice tone="error">{errorMessage(load.error)}</Notice> : <p className="text-sm text-muted">Loading…</p>;
  const label = <span className="font-mono font-medium">{snapshot.label}</span>;

  if (snapshot.status === 'ready') {
    return (
      <Notice tone="info">
        {label} is ready:{' '}
        <Link to={`/snapshots/${snapshot.id}`} className="font-medium underline">
          open snapshot {snapshot.label}
        </Link>{' '}
        ({snapshot.fileCount} files, {snapshot.metrics?.classCount ?? 0} {snapshot.metrics?.classCount === 1 ? 'clone class' : 'clone classes'}).
      </Notice>
    );
  }
  if (snapshot.status === 'failed') {
    return (
      <Notice tone="error">
        Loading {label} failed: {snapshot.error ?? 'no reason was recorded.'}
      </Notice>
    );
  }
  if (snapshot.status === 'cancelled') {
    return <Notice tone="warning">Loading {label} was cancelled; nothing of it was kept.</Notice>;
  }

  const value = percent(snapshot);
  const text = phaseText(snapshot);
  return (
    <div className="space-y-1.5" data-testid={`load-${snapshot.id}`}>
      <div className="flex items-baseline justify-between gap-3 text-sm">
        <span>
          Loading {label}: <span aria-live="polite">{text}</span>
        </span>
        {mayCancel(snapshot) ? (
          <Button variant="danger" className="px-2 py-0.5 text-xs" disabled={cancel.isPending} onClick={() => cancel.mutate(snapshot.id)}>
            Cancel
          </Button>
        ) : null}
      </div>
      <div
        role="progressbar"
        aria-label={`Loading ${snapshot.label}`}
        aria-valuemin={0}
        aria-valuemax={100}
        aria-valuenow={value}
        aria-valuetext={text}
        className="h-2 overflow-hidden rounded-sm border border-line bg-paper"
      >
        <div className="h-full bg-accent transition-[width]" style={{ width: `${value}%` }} />
      </div>
      {cancel.isError ? <Notice tone="error">{errorMessage(cancel.error)}</Notice> : null}
    </div>
  );
}
