import type { TaskEventDTO } from '@shared/api/tasks';
import { formatDateTime } from '@/lib/format';

/** What one history entry says, in words. */
function describe(event: TaskEventDTO): string {
  switch (event.kind) {
    case 'created':
      return `created the task${event.note ? `, ${event.note}` : ''}`;
    case 'status':
      return `moved it from ${event.from} to ${event.to}`;
    case 'assignee':
      return `reassigned it from ${event.from ?? 'nobody'} to ${event.to}`;
    case 'title':
      return `renamed it from “${event.from}” to “${event.to}”`;
    case 'description':
      return 'edited the description';
    case 'due':
      return event.to ? `set the due date to ${event.to}${event.from ? ` (was ${event.from})` : ''}` : `cleared the due date (was ${event.from})`;
  }
}

/** A task's history, oldest first: who, when, from, to; Doublet's own changes say so. */
export function TaskHistory({ events }: { events: TaskEventDTO[] }) {
  return (
    <ol className="space-y-2 text-sm" aria-label="History">
      {events.map((e) => (
        <li key={e.id} className="border-l-2 border-line pl-3">
          <div>
            <span className="font-semibold">{e.automatic ? 'Doublet' : (e.actor?.name ?? 'A former member')}</span> {describe(e)}
            {e.kind === 'status' && e.note ? <span className="text-muted"> — {e.note}</span> : null}
          </div>
          <div className="font-mono text-xs text-muted">{formatDateTime(e.createdAt)}</div>
        </li>
      ))}
    </ol>
  );
}
