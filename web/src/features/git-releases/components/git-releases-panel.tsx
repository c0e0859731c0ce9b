import { useEffect, useRef, useState, type FormEvent } from 'react';
import { useQueryClient } from '@tanstack/react-query';
import { gitLinkSchema, type GitLinkDTO } from '@shared/api/git-links';
import { Button } from '@/components/button';
import { QueryState } from '@/components/data-state';
import { TextField } from '@/components/field';
import { Notice, errorMessage } from '@/components/notice';
import { ApiError } from '@/lib/api-client';
import { validate, type FieldErrors } from '@/lib/form';
import { useDeleteGitLink } from '@/features/git-releases/api/delete-git-link';
import { useGitLink } from '@/features/git-releases/api/get-git-link';
import { useSaveGitLink } from '@/features/git-releases/api/save-git-link';
import { useStartGitImport } from '@/features/git-releases/api/start-git-import';
import { describeImport } from '@/features/git-releases/lib/describe-import';

/**
 * The repository's git releases: leads link a remote and a tag pattern; engineers and leads start
 * "Import releases" (later "Check for new tags"); everyone who sees it reads the last import's
 * outcome, followed live while it runs.
 */
export function GitReleasesPanel({ repositoryId, mayLink }: { repositoryId: number; mayLink: boolean }) {
  const link = useGitLink(repositoryId);
  useRefreshWhenImportEnds(repositoryId, link.data?.gitLink ?? null);
  if (!link.data) return <QueryState query={link} what="the git link" />;
  const gitLink = link.data.gitLink;
  return (
    <div className="space-y-3">
      {gitLink ? <ImportStatus repositoryId={repositoryId} gitLink={gitLink} /> : <p className="text-sm text-muted">Not linked to a git remote.</p>}
      {mayLink ? <GitLinkForm repositoryId={repositoryId} gitLink={gitLink} /> : null}
    </div>
  );
}

/** When a running import ends, the snapshots, trend and figures of the repository are refetched. */
function useRefreshWhenImportEnds(repositoryId: number, gitLink: GitLinkDTO | null) {
  const queryClient = useQueryClient();
  const status = gitLink?.lastImport?.status;
  const previous = useRef(status);
  useEffect(() => {
    const wasActive = previous.current === 'queued' || previous.current === 'running';
    previous.current = status;
    if (wasActive && (status === 'succeeded' || status === 'failed')) void queryClient.invalidateQueries({ queryKey: ['repositories'] });
  }, [status, queryClient, repositoryId]);
}

function ImportStatus({ repositoryId, gitLink }: { repositoryId: number; gitLink: GitLinkDTO }) {
  const start = useStartGitImport(repositoryId);
  const last = gitLink.lastImport;
  const active = last?.status === 'queued' || last?.status === 'running';
  return (
    <div className="space-y-2">
      <p className="text-sm break-all">
        <span className="font-mono text-xs">{gitLink.remoteUrl}</span>
        <span className="text-muted"> · tags </span>
        <span className="font-mono text-xs">{gitLink.tagPattern}</span>
      </p>
      {last ? <Notice tone={last.status === 'failed' ? 'error' : 'info'}>{describeImport(last)}</Notice> : null}
      {start.isError ? <Notice tone="error">{errorMessage(start.error)}</Notice> : null}
      {start.data && !start.data.queued ? <Notice>An import is already queued or running; it picks up the tags.</Notice> : null}
      <Button variant="secondary" disabled={active || start.isPending} onClick={() => start.mutate()}>
        {last ? 'Check for new tags' : 'Import releases'}
      </Button>
    </div>
  );
}

function GitLinkForm({ repositoryId, gitLink }: { repositoryId: number; gitLink: GitLinkDTO | null }) {
  const save = useSaveGitLink(repositoryId);
  const unlink = useDeleteGitLink(repositoryId);
  const [errors, setErrors] = useState<FieldErrors>({});

  const submit = (event: FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    const form = new FormData(event.currentTarget);
    const result = validate(gitLinkSchema, { remoteUrl: form.get('remoteUrl'), tagPattern: form.get('tagPattern') || '*' });
    if (!result.ok) return setErrors(result.errors);
    setErrors({});
    save.mutate(result.data, {
      onError: (error) => {
        if (error instanceof ApiError && error.field) setErrors({ [error.field]: error.message.replace(/^\w+: /, '') });
      },
    });
  };

  return (
    <form key={gitLink?.updatedAt ?? 'new'} onSubmit={submit} noValidate className="space-y-3 border-t border-line pt-3">
      {save.isSuccess ? <Notice>Link saved.</Notice> : null}
      {save.isError && !(save.error instanceof ApiError && save.error.field) ? <Notice tone="error">{errorMessage(save.error)}</Notice> : null}
      <TextField
        label="Remote"
        name="remoteUrl"
        className="font-mono"
        defaultValue={gitLink?.remoteUrl ?? ''}
        placeholder="https://git.example/team/app.git"
        hint="https://, ssh://, user@host:path or a local mirror. No credentials: the server's credential helper or ssh key supplies them."
        error={errors.remoteUrl}
      />
      <TextField
        label="Tag pattern"
        name="tagPattern"
        className="font-mono"
        defaultValue={gitLink?.tagPattern ?? '*'}
        hint="* matches any run of characters, ? one. Each matching tag becomes a snapshot, oldest first."
        error={errors.tagPattern}
      />
      <div className="flex flex-wrap gap-2">
        <Button type="submit" disabled={save.isPending}>
          {gitLink ? 'Save link' : 'Link repository'}
        </Button>
        {gitLink ? (
          <Button variant="danger" disabled={unlink.isPending} onClick={() => unlink.mutate()}>
            Unlink
          </Button>
        ) : null}
      </div>
    </form>
  );
}
