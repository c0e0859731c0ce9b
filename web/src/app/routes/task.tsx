import { useQuery } from '@tanstack/react-query';
import type { ReactNode } from 'react';
import { Link, useParams } from 'react-router-dom';
import { can } from '@shared/permissions';
import type { TaskDetailDTO } from '@shared/api/tasks';
import { QueryState } from '@/components/data-state';
import { Notice } from '@/components/notice';
import { PageHeader } from '@/components/page-header';
import { Panel } from '@/components/panel';
import { formatDateTime } from '@/lib/format';
import { useSession } from '@/features/auth/api/get-session';
import { cloneClassQueryOptions } from '@/features/clone-classes/api/get-clone-class';
import { ClassMembers } from '@/features/clone-classes/components/class-members';
import { StatusBadge } from '@/features/clone-classes/components/status-badge';
import { useTask } from '@/features/tasks/api/get-task';
import { TaskAssignment } from '@/features/tasks/components/task-assignment';
import { TaskEditor } from '@/features/tasks/components/task-editor';
import { TaskComments } from '@/features/tasks/components/task-comments';
import { TaskHistory } from '@/features/tasks/components/task-history';
import { TaskStatusActions } from '@/features/tasks/components/task-status-actions';
import { OverdueBadge, TaskStatusBadge } from '@/features/tasks/components/task-status-badge';

/** The lineage's latest class, its members side by side (the class view's own component). */
function TaskClass({ task }: { task: TaskDetailDTO }) {
  const detail = useQuery({ ...cloneClassQueryOptions(task.cloneClassId ?? 0), enabled: task.cloneClassId !== null });
  if (task.cloneClassId === null) return <p className="text-sm text-muted">The class of this task is no longer stored.</p>;
  if (!detail.data) return <QueryState query={detail} what="the clone class" />;
  return (
    <div className="space-y-3">
      <div className="flex flex-wrap items-center gap-3 font-mono text-xs">
        <Link to={`/clone-classes/${detail.data.id}`} className="text-accent-strong hover:underline">
          Clone class #{detail.data.id}
        </Link>
        <span>in {task.snapshotLabel}</span>
        <StatusBadge status={detail.data.status} />
        <span>{detail.data.size} members</span>
        <span>{detail.data.tokens} tokens</span>
      </div>
      <ClassMembers key={detail.data.id} detail={detail.data} />
    </div>
  );
}

function TaskPage({ task }: { task: TaskDetailDTO }) {
  const user = useSession().data?.user;
  const isLead = user !== undefined && user !== null && can(user.role, 'tasks.assign');
  const mayWork = isLead || (user?.role === 'engineer' && task.assignee?.id === user.id);
  const mayComment = user !== undefined && user !== null && can(user.role, 'tasks.comment');
  const facts: [string, ReactNode][] = [
    ['status', <TaskStatusBadge key="s" status={task.status} />],
    ['assignee', task.assignee?.name ?? 'nobody'],
    ['due', <span key="d">{task.dueOn ?? '—'}{task.overdue ? <OverdueBadge /> : null}</span>],
    ['repository', <Link key="r" to={`/repositories/${task.repositoryId}`} className="font-mono text-accent-strong hover:underline">{task.repositoryName}</Link>],
    ['created by', `${task.createdBy?.name ?? 'a former member'}, ${formatDateTime(task.createdAt)}`],
  ];
  return (
    <div className="max-w-[110rem] space-y-4">
      <div>
        <div className="mb-1 text-xs text-muted">
          <Link to="/tasks" className="hover:underline">
            Tasks
          </Link>{' '}
          /
        </div>
        <PageHeader title={`#${task.id} ${task.title}`} />
        <dl className="mb-3 flex flex-wrap gap-x-6 gap-y-1 text-sm">
          {facts.map(([label, value]) => (
            <div key={label} className="flex items-baseline gap-1.5">
              <dt className="text-xs text-muted">{label}</dt>
              <dd>{value}</dd>
            </div>
          ))}
        </dl>
        {task.closedBySnapshot && task.status === 'done' ? (
          <Notice>Doublet marked this task done: snapshot {task.closedBySnapshot.label} no longer has the copies. It reopens if they come back.</Notice>
        ) : null}
        {task.status === 'wont_do' && task.wontDoReason ? <Notice tone="warning">Won't do: {task.wontDoReason}</Notice> : null}
        {task.description ? <p className="my-3 max-w-3xl text-sm whitespace-pre-wrap">{task.description}</p> : null}
        <div className="mt-3 space-y-3">
          <TaskStatusActions key={task.status} task={task} mayWork={mayWork} isLead={isLead} />
          {isLead ? (
            <div className="max-w-2xl space-y-3">
              <TaskAssignment key={`${task.assignee?.id}-${task.dueOn}`} task={task} />
              <TaskEditor key={`${task.title}-${task.description}`} task={task} />
            </div>
          ) : null}
        </div>
      </div>
      <Panel title="The copies">
        <TaskClass task={task} />
      </Panel>
      <div className="grid items-start gap-4 lg:grid-cols-2">
        <Panel title={`Comments (${task.comments.length})`}>
          <TaskComments taskId={task.id} comments={task.comments} mayComment={mayComment} />
        </Panel>
        <Panel title="History">
          <TaskHistory events={task.events} />
        </Panel>
      </div>
    </div>
  );
}

/** /tasks/:id: a refactor task with its class side by side, its history and comments. */
export function TaskRoute() {
  const id = Number(useParams().id);
  const task = useTask(id);
  if (!task.data) {
    return (
      <div className="max-w-lg">
        <QueryState query={task} what="the task" />
      </div>
    );
  }
  return <TaskPage task={task.data} />;
}
