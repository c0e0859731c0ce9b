import type { MemberDTO, TaskCommentDTO, TaskDetailDTO, TaskDTO, TaskEventDTO } from '../../shared/api/tasks';
import type { Role } from '../../shared/roles';
import type { TaskRow } from '../queries/tasks';

const iso = (value: Date | string) => (value instanceof Date ? value.toISOString() : new Date(value).toISOString());

/** A task row as the API shows it: an explicit field list (no organisation id). */
export function presentTask(row: TaskRow): TaskDTO {
  return {
    id: row.id,
    title: row.title,
    description: row.description,
    status: row.status,
    wontDoReason: row.wontDoReason,
    dueOn: row.dueOn,
    overdue: Boolean(row.overdue),
    repositoryId: row.repositoryId,
    repositoryName: row.repositoryName,
    lineageId: row.lineageId,
    cloneClassId: row.cloneClassId,
    snapshotId: row.snapshotId,
    snapshotLabel: row.snapshotLabel,
    assignee: row.assignee,
    createdBy: row.createdBy,
    closedBySnapshot: row.closedBySnapshot,
    commentCount: row.commentCount,
    createdAt: iso(row.createdAt),
    updatedAt: iso(row.updatedAt),
  };
}

/** A comment with its time as ISO text. */
export function presentTaskComment(comment: TaskCommentDTO): TaskCommentDTO {
  return { id: comment.id, author: comment.author, body: comment.body, createdAt: iso(comment.createdAt) };
}

/** A task with its history and comments. */
export function presentTaskDetail(row: TaskRow, events: TaskEventDTO[], comments: TaskCommentDTO[]): TaskDetailDTO {
  return {
    ...presentTask(row),
    events: events.map((e) => ({ id: e.id, kind: e.kind, automatic: e.automatic, actor: e.actor, from: e.from, to: e.to, note: e.note, createdAt: iso(e.createdAt) })),
    comments: comments.map(presentTaskComment),
  };
}

/** An active member as a lead assigning work sees them. */
export function presentMember(row: { id: string; name: string; role: string }): MemberDTO {
  return { id: row.id, name: row.name, role: row.role as Role };
}
