import { useState, type FormEvent } from 'react';
import { ACTIVE_TASK_STATUSES, TASK_LIMITS, TASK_STATUSES, TASK_TRANSITIONS, type TaskDTO, type TaskStatus } from '@shared/api/tasks';
import { Button } from '@/components/button';
import { Notice, errorMessage } from '@/components/notice';
import { TextAreaField } from '@/components/textarea-field';
import { useUpdateTask } from '@/features/tasks/api/update-task';

/** The words of the button that moves a task to each status. */
const MOVE_LABELS: Record<TaskStatus, string> = {
  open: 'Reopen',
  in_progress: 'Start work',
  in_review: 'Ready for review',
  done: 'Mark done',
  wont_do: "Won't do…",
};

/** "Back to …" when a move goes backwards in the workflow. */
function moveLabel(from: TaskStatus, to: TaskStatus): string {
  if (from === 'in_progress' && to === 'open') return 'Back to open';
  if (from === 'in_review' && to === 'in_progress') return 'Back to in progress';
  return MOVE_LABELS[to];
}

/** A move back in the workflow (shown plainer than the next step). */
const isBackward = (from: TaskStatus, to: TaskStatus) => TASK_STATUSES.indexOf(to) < TASK_STATUSES.indexOf(from);

/**
 * The status moves the reader may make: the workflow's next steps for the assignee or a lead, and
 * for a lead "Won't do…" (with a required reason) and reopening from it. Nothing for the others.
 */
export function TaskStatusActions({ task, mayWork, isLead }: { task: TaskDTO; mayWork: boolean; isLead: boolean }) {
  const update = useUpdateTask(task.id);
  const [closing, setClosing] = useState(false);
  const [reason, setReason] = useState('');
  if (!mayWork) return null;
  // reopening a task closed as won't do is a lead's move
  const moves = isLead || task.status !== 'wont_do' ? TASK_TRANSITIONS[task.status] : [];
  const mayClose = isLead && ACTIVE_TASK_STATUSES.includes(task.status);
  const submit = (event: FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    update.mutate({ status: 'wont_do', reason }, { onSuccess: () => setClosing(false) });
  };
  return (
    <div className="space-y-2">
      <div className="flex flex-wrap gap-2" role="group" aria-label="Change status">
        {moves.map((to) => (
          <Button key={to} variant={isBackward(task.status, to) ? 'secondary' : 'primary'} disabled={update.isPending} onClick={() => update.mutate({ status: to })}>
            {moveLabel(task.status, to)}
          </Button>
        ))}
        {mayClose && !closing ? (
          <Button variant="secondary" onClick={() => setClosing(true)}>
            {MOVE_LABELS.wont_do}
          </Button>
        ) : null}
      </div>
      {closing ? (
        <form onSubmit={submit} aria-label="Close as won't do" className="max-w-xl space-y-2">
          <TextAreaField label="Why won't it be done?" value={reason} onChange={(e) => setReason(e.target.value)} required maxLength={TASK_LIMITS.reason} rows={2} />
          <div className="flex gap-2">
            <Button type="submit" variant="danger" disabled={update.isPending || reason.trim() === ''}>
              Close as won't do
            </Button>
            <Button variant="secondary" onClick={() => setClosing(false)}>
              Cancel
            </Button>
          </div>
        </form>
      ) : null}
      {update.error ? <Notice tone="error">{errorMessage(update.error)}</Notice> : null}
    </div>
  );
}
