import clsx from 'clsx';
import { TASK_STATUS_LABELS, type TaskStatus } from '@shared/api/tasks';

const TONES: Record<TaskStatus, string> = {
  open: 'bg-accent-soft text-accent-strong',
  in_progress: 'bg-amber-soft text-amber-strong',
  in_review: 'bg-amber-soft text-amber-strong border border-amber/40',
  done: 'bg-paper text-accent-strong border border-line',
  wont_do: 'bg-paper text-muted border border-line',
};

/** A task status as a small label. */
export function TaskStatusBadge({ status }: { status: TaskStatus }) {
  return <span className={clsx('inline-block rounded-sm px-1.5 py-0.5 text-[11px] leading-none font-semibold whitespace-nowrap', TONES[status])}>{TASK_STATUS_LABELS[status]}</span>;
}

/** "overdue" beside a due date that has passed on an active task. */
export function OverdueBadge() {
  return <span className="ml-1 rounded-sm bg-danger-soft px-1 py-0.5 text-[11px] leading-none font-semibold text-danger">overdue</span>;
}
