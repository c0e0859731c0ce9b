import { useState, type FormEvent } from 'react';
import { roleRank } from '@shared/roles';
import { TASK_LIMITS } from '@shared/api/tasks';
import { Button } from '@/components/button';
import { SelectField, TextField } from '@/components/field';
import { Notice, errorMessage } from '@/components/notice';
import { TextAreaField } from '@/components/textarea-field';
import { ApiError } from '@/lib/api-client';
import { useCreateTask } from '@/features/tasks/api/create-task';
import { useMembers } from '@/features/tasks/api/get-members';

/**
 * A lead's form to open a refactor task on a clone class: title (prefilled), description, assignee
 * (the organisation's active engineers, leads and admins) and an optional due date.
 */
export function CreateTaskForm({ cloneClassId, suggestedTitle, onDone }: { cloneClassId: number; suggestedTitle: string; onDone: () => void }) {
  const members = useMembers();
  const create = useCreateTask();
  const [title, setTitle] = useState(suggestedTitle);
  const [description, setDescription] = useState('');
  const [assigneeId, setAssigneeId] = useState('');
  const [dueOn, setDueOn] = useState('');
  const assignable = (members.data?.members ?? []).filter((m) => roleRank(m.role) >= roleRank('engineer'));
  const fieldError = (field: string) => (create.error instanceof ApiError && create.error.field === field ? create.error.message : undefined);
  const submit = (event: FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    create.mutate({ cloneClassId, title, description: description || undefined, assigneeId, dueOn: dueOn || undefined }, { onSuccess: onDone });
  };
  return (
    <form onSubmit={submit} aria-label="Create refactor task" className="max-w-2xl space-y-3 rounded-sm border border-line bg-panel p-4">
      <TextField label="Title" value={title} onChange={(e) => setTitle(e.target.value)} required maxLength={TASK_LIMITS.title} error={fieldError('title')} />
      <TextAreaField label="Description (optional)" value={description} onChange={(e) => setDescription(e.target.value)} maxLength={TASK_LIMITS.description} rows={3} error={fieldError('description')} />
      <div className="grid gap-3 sm:grid-cols-2">
        <SelectField label="Assignee" value={assigneeId} onChange={(e) => setAssigneeId(e.target.value)} required error={fieldError('assigneeId')}>
          <option value="">{members.isPending ? 'Loading members…' : 'Choose someone'}</option>
          {assignable.map((m) => (
            <option key={m.id} value={m.id}>
              {m.name} ({m.role})
            </option>
          ))}
        </SelectField>
        <TextField label="Due date (optional)" type="date" value={dueOn} onChange={(e) => setDueOn(e.target.value)} error={fieldError('dueOn')} />
      </div>
      <div className="flex gap-2">
        <Button type="submit" disabled={create.isPending || !assigneeId || title.trim() === ''}>
          Create task
        </Button>
        <Button variant="secondary" onClick={onDone}>
          Cancel
        </Button>
      </div>
      {create.error && !(create.error instanceof ApiError && create.error.field && create.error.field !== 'cloneClassId') ? <Notice tone="error">{errorMessage(create.error)}</Notice> : null}
    </form>
  );
}
