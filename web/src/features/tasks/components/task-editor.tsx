import { useState, type FormEvent } from 'react';
import { TASK_LIMITS, type TaskDTO } from '@shared/api/tasks';
import { Button } from '@/components/button';
import { TextField } from '@/components/field';
import { Notice, errorMessage } from '@/components/notice';
import { TextAreaField } from '@/components/textarea-field';
import { useUpdateTask } from '@/features/tasks/api/update-task';

/** A lead's "Edit" of a task's title and description (each change lands in the history). */
export function TaskEditor({ task }: { task: TaskDTO }) {
  const update = useUpdateTask(task.id);
  const [open, setOpen] = useState(false);
  const [title, setTitle] = useState(task.title);
  const [description, setDescription] = useState(task.description);
  if (!open) {
    return (
      <Button variant="secondary" onClick={() => setOpen(true)}>
        Edit title and description
      </Button>
    );
  }
  const submit = (event: FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    const changes = { ...(title.trim() !== task.title ? { title } : {}), ...(description.trim() !== task.description ? { description } : {}) };
    if (Object.keys(changes).length === 0) return setOpen(false);
    update.mutate(changes, { onSuccess: () => setOpen(false) });
  };
  return (
    <form onSubmit={submit} aria-label="Edit task" className="max-w-2xl space-y-2">
      <TextField label="Title" value={title} onChange={(e) => setTitle(e.target.value)} required maxLength={TASK_LIMITS.title} />
      <TextAreaField label="Description" value={description} onChange={(e) => setDescription(e.target.value)} maxLength={TASK_LIMITS.description} rows={4} />
      <div className="flex gap-2">
        <Button type="submit" disabled={update.isPending || title.trim() === ''}>
          Save
        </Button>
        <Button variant="secondary" onClick={() => setOpen(false)}>
          Cancel
        </Button>
      </div>
      {update.error ? <Notice tone="error">{errorMessage(update.error)}</Notice> : null}
    </form>
  );
}
