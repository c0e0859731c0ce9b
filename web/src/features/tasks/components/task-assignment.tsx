import { useState, type FormEvent } from 'react';
import { roleRank } from '@shared/roles';
import type { TaskDTO } from '@shared/api/tasks';
import { Button } from '@/components/button';
import { SelectField, TextField } from '@/components/field';
import { Notice, errorMessage } from '@/components/notice';
import { useMembers } from '@/features/tasks/api/get-members';
import { useUpdateTask } from '@/features/tasks/api/update-task';

/** A lead's reassignment and due date of a task, saved together. */
export function TaskAssignment({ task }: { task: TaskDTO }) {
  const members = useMembers();
  const update = useUpdateTask(task.id);
  const [assigneeId, setAssigneeId] = useState(task.assignee?.id ?? '');
  const [dueOn, setDueOn] = useState(task.dueOn ?? '');
  const assignable = (members.data?.members ?? []).filter((m) => roleRank(m.role) >= roleRank('engineer'));
  const changed = assigneeId !== (task.assignee?.id ?? '') || dueOn !== (task.dueOn ?? '');
  const submit = (event: FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    update.mutate({ ...(assigneeId && assigneeId !== task.assignee?.id ? { assigneeId } : {}), ...(dueOn !== (task.dueOn ?? '') ? { dueOn: dueOn || null } : {}) });
  };
  return (
    <form onSubmit={submit} aria-label="Assignment" className="grid items-end gap-2 sm:grid-cols-[1fr_10rem_auto]">
      <SelectField label="Assignee" value={assigneeId} onChange={(e) => setAssigneeId(e.target.value)}>
        {task.assignee && !assignable.some((m) => m.id === task.assignee!.id) ? <option value={task.assignee.id}>{task.assignee.name}</option> : null}
        {!task.assignee ? <option value="">nobody</option> : null}
        {assignable.map((m) => (
          <option key={m.id} value={m.id}>
            {m.name} ({m.role})
          </option>
        ))}
      </SelectField>
      <TextField label="Due date" type="date" value={dueOn} onChange={(e) => setDueOn(e.target.value)} />
      <Button type="submit" variant="secondary" disabled={!changed || update.isPending}>
        Save
      </Button>
      {update.error ? (
        <div className="sm:col-span-3">
          <Notice tone="error">{errorMessage(update.error)}</Notice>
        </div>
      ) : null}
    </form>
  );
}
