import { useState, type FormEvent } from 'react';
import { TASK_LIMITS, type TaskCommentDTO } from '@shared/api/tasks';
import { Button } from '@/components/button';
import { Notice, errorMessage } from '@/components/notice';
import { TextAreaField } from '@/components/textarea-field';
import { formatDateTime } from '@/lib/format';
import { useCommentOnTask } from '@/features/tasks/api/comment-on-task';

/** A task's comments, oldest first, and (for engineers and up) a form to add one. */
export function TaskComments({ taskId, comments, mayComment }: { taskId: number; comments: TaskCommentDTO[]; mayComment: boolean }) {
  const comment = useCommentOnTask(taskId);
  const [body, setBody] = useState('');
  const submit = (event: FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    comment.mutate({ body }, { onSuccess: () => setBody('') });
  };
  return (
    <div className="space-y-3">
      {comments.length === 0 ? <p className="text-sm text-muted">No comments yet.</p> : null}
      <ul className="space-y-3" aria-label="Comments">
        {comments.map((c) => (
          <li key={c.id} className="rounded-sm border border-line bg-white px-3 py-2 text-sm">
            <div className="mb-1 flex flex-wrap items-baseline justify-between gap-2">
              <span className="font-semibold">{c.author?.name ?? 'A former member'}</span>
              <span className="font-mono text-xs text-muted">{formatDateTime(c.createdAt)}</span>
            </div>
            <p className="whitespace-pre-wrap">{c.body}</p>
          </li>
        ))}
      </ul>
      {mayComment ? (
        <form onSubmit={submit} aria-label="Add a comment" className="space-y-2">
          <TextAreaField label="Comment" value={body} onChange={(e) => setBody(e.target.value)} required maxLength={TASK_LIMITS.comment} rows={3} />
          <Button type="submit" disabled={comment.isPending || body.trim() === ''}>
            Comment
          </Button>
          {comment.error ? <Notice tone="error">{errorMessage(comment.error)}</Notice> : null}
        </form>
      ) : null}
    </div>
  );
}
